// Set a new password from a reset link, and sign in.
import { ResetBody } from '#shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { token, password } = await readValidatedBody(event, parseWith(ResetBody))
  const passwordHash = await hashPassword(password)
  const user = await transaction(async (tx) => {
    const found = await findLiveToken(tx, 'reset', token)
    if (!found || !found.active || !(await consumeToken(tx, found.tokenId))) {
      throw createError({ statusCode: 404, statusMessage: 'This reset link is not valid any more. Ask for a new one.' })
    }
    await tx.updateTable('users').set({ password_hash: passwordHash }).where('id', '=', found.userId).execute()
    // A new password ends every session the old one opened.
    await endSessions(tx, found.userId)
    return found
  })
  await startSession(event, { id: user.userId, shopId: user.shopId, name: user.name, role: user.role })
  return loadMe(useDb(), user.userId)
})
