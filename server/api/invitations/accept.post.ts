// Accept an invitation: set a password and sign in.
import { AcceptInvitationBody } from '#shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const body = await readValidatedBody(event, parseWith(AcceptInvitationBody))
  const passwordHash = await hashPassword(body.password)
  const user = await transaction(async (tx) => {
    const found = await findLiveToken(tx, 'invite', body.token)
    if (!found || !found.active || !(await consumeToken(tx, found.tokenId))) {
      throw createError({ statusCode: 404, statusMessage: 'This invitation is not valid any more. Ask the shop owner to send a new one.' })
    }
    await tx.updateTable('users')
      // The invitation reached this address, which confirms it.
      .set({ password_hash: passwordHash, last_login_at: new Date(), email_confirmed_at: new Date(), ...(body.name && { name: body.name }) })
      .where('id', '=', found.userId).where('shop_id', '=', found.shopId)
      .execute()
    return { ...found, name: body.name ?? found.name }
  })
  await startSession(event, { id: user.userId, shopId: user.shopId, name: user.name, role: user.role })
  return loadMe(useDb(), user.userId)
})
