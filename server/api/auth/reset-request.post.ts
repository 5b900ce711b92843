// Ask for a password-reset link. The answer is the same whether or not the account exists, and
// whether or not a mail went: a link still fresh is neither cancelled nor followed by another,
// and one address gets only a few links an hour (server/utils/platform/shop-mail.ts).
import { ResetRequestBody } from '#shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { email } = await readValidatedBody(event, parseWith(ResetRequestBody))
  const user = await useDb().selectFrom('users').select(['id', 'shop_id', 'name', 'active'])
    .where('email', '=', email).executeTakeFirst()
  if (user?.active) {
    await sendAccountLink({ id: user.id, shopId: user.shop_id }, 'reset', 60,
      (token) => resetMail({ to: email, name: user.name, link: `${publicBaseUrl(event)}/reset/${token}` }))
  }
  setResponseStatus(event, 202)
  return { message: 'If an account uses that address, a reset link is on its way (or already in your inbox). It works for one hour.' }
})
