// Sign in with e-mail and password; throttled per account and address (server/utils/platform/throttle.ts).
import { LoginBody } from '#shared/schemas/auth'

// Verified against when the account is unknown, so both answers take the same time.
let decoyHash: Promise<string> | undefined

export default defineEventHandler(async (event) => {
  const { email, password } = await readValidatedBody(event, parseWith(LoginBody))
  const address = clientAddress(event)
  const attempt = await claimLoginAttempt(event, email, address)

  const db = useDb()
  const user = await db.selectFrom('users')
    .select(['id', 'shop_id', 'name', 'role', 'password_hash', 'active'])
    .where('email', '=', email)
    .executeTakeFirst()
  decoyHash ??= hashPassword('kerfbook-decoy-password')
  const ok = await verifyPassword(user?.password_hash ?? await decoyHash, password)
  if (!user || !user.password_hash || !ok || !user.active) {
    throw createError({
      statusCode: 401,
      statusMessage: user && ok && !user.active
        ? 'This account has been switched off. Ask the shop owner.'
        : 'Wrong e-mail or password.',
    })
  }
  await loginSucceeded(attempt)
  await db.updateTable('users').set({ last_login_at: new Date() }).where('id', '=', user.id).execute()
  await startSession(event, { id: user.id, shopId: user.shop_id, name: user.name, role: user.role })
  return loadMe(db, user.id)
})
