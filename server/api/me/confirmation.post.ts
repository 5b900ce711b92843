// Send the link that confirms one's e-mail address again (the first one was lost or expired).
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  if (!user.email) {
    throw createError({ statusCode: 409, statusMessage: 'Your account has no e-mail address to confirm: you sign in with a PIN on the shop\'s devices.' })
  }
  const row = await useDb().selectFrom('users').select('email_confirmed_at')
    .where('id', '=', user.id).where('shop_id', '=', user.shopId).executeTakeFirstOrThrow()
  if (row.email_confirmed_at) {
    throw createError({ statusCode: 409, statusMessage: `${user.email} is already confirmed.` })
  }
  const sent = await sendConfirmation(event, { ...user, email: user.email })
  setResponseStatus(event, 202)
  return {
    sent,
    message: sent
      ? `A confirmation link is on its way to ${user.email}.`
      : `A link was sent to ${user.email} a few minutes ago (or several this hour): look for it, including in spam, before asking again.`,
  }
})
