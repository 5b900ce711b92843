// Change one's own password; the current one is required, and wrong tries count toward the same
// throttle as sign-in. Every session of the person ends (a copied cookie stops working), then this
// browser is signed in again (startSession, the one place sessions are made).
import { PasswordChangeBody } from '#shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { currentPassword, newPassword } = await readValidatedBody(event, parseWith(PasswordChangeBody))
  // Counted with the e-mail sign-ins; one added by name only has no address and no password to guess.
  const attempt = await claimLoginAttempt(event, user.email ?? `user:${user.id}`, clientAddress(event))
  const db = useDb()
  const row = await db.selectFrom('users').select('password_hash').where('shop_id', '=', user.shopId).where('id', '=', user.id).executeTakeFirstOrThrow()
  if (!row.password_hash || !(await verifyPassword(row.password_hash, currentPassword))) {
    const message = row.password_hash ? 'this is not your current password' : user.email ? 'this account signs in without a password; ask the owner for a reset link' : 'you sign in with a PIN on the shop\'s devices; ask the crib manager to change it'
    badField('currentPassword', message)
  }
  await loginSucceeded(attempt)
  const hash = await hashPassword(newPassword)
  await db.transaction().execute(async (tx) => {
    await tx.updateTable('users').set({ password_hash: hash })
      .where('shop_id', '=', user.shopId).where('id', '=', user.id).execute()
    await endSessions(tx, user.id)
  })
  await startSession(event, user)
  return { changed: true }
})
