// Confirm one's e-mail address from the link in the mail. Needs no session: the link may be
// opened on another device than the one that signed up.
import { ConfirmEmailBody } from '#shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { token } = await readValidatedBody(event, parseWith(ConfirmEmailBody))
  const confirmed = await transaction(async (tx) => {
    const found = await findLiveToken(tx, 'confirm', token)
    if (!found || !found.active || !(await consumeToken(tx, found.tokenId))) {
      throw createError({ statusCode: 404, statusMessage: 'This confirmation link is not valid any more. Sign in and send a new one from the account page.' })
    }
    await tx.updateTable('users').set({ email_confirmed_at: new Date() })
      .where('id', '=', found.userId).where('shop_id', '=', found.shopId).where('email_confirmed_at', 'is', null)
      .execute()
    return found
  })
  return { email: confirmed.email, message: `Thank you: ${confirmed.email} is confirmed, and ${confirmed.shopName} can send mail now.` }
})
