// Change one's own password; the current one is required, and wrong tries count toward the same
// throttle as sign-in. The session is started again (startSession, the one place sessions are made).
import { PasswordChangeBody } from '#shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { currentPassword, newPassword } = await readValidatedBody(event, parseWith(PasswordChangeBody))
  const address = clientAddress(event)
  await assertNotThrottled(event, user.email, address)
  const db = useDb()
  const row = await db.selectFrom('users').select('password_hash').where('shop_id', '=', user.shopId).where('id', '=', user.id).executeTakeFirstOrThrow()
  if (!row.password_hash || !(await verifyPassword(row.password_hash, currentPassword))) {
    await recordLoginAttempt(user.email, address, false)
    const message = row.password_hash ? 'this is not your current password' : 'this account signs in without a password; ask the owner for a reset link'
    throw createError({ statusCode: 400, statusMessage: `currentPassword: ${message}`, data: { fields: { currentPassword: message } } })
  }
  await db.updateTable('users').set({ password_hash: await hashPassword(newPassword) })
    .where('shop_id', '=', user.shopId).where('id', '=', user.id).execute()
  await startSession(event, user)
  return { changed: true }
})
