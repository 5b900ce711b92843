// Sign out everywhere: every session of the signed-in person ends (other phones and desks too).
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  await endSessions(useDb(), user.id)
  await clearUserSession(event)
  setResponseStatus(event, 204)
  return null
})
