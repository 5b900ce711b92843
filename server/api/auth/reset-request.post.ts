// Ask for a password-reset link. The answer is the same whether or not the account exists.
import { ResetRequestBody } from '#shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { email } = await readValidatedBody(event, parseWith(ResetRequestBody))
  const db = useDb()
  const user = await db.selectFrom('users').select(['id', 'shop_id', 'name', 'active'])
    .where('email', '=', email).executeTakeFirst()
  if (user?.active) {
    const token = await issueToken(db, { shopId: user.shop_id, userId: user.id, purpose: 'reset', ttlMinutes: 60 })
    await sendMail(resetMail({ to: email, name: user.name, link: `${publicBaseUrl(event)}/reset/${token}` }))
  }
  setResponseStatus(event, 202)
  return { message: 'If an account uses that address, a reset link is on its way. It works for one hour.' }
})
