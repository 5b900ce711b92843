// Sign out: this session's row goes and the sealed cookie is cleared, so a copy of the cookie
// taken before stops working too.
export default defineEventHandler(async (event) => {
  await endSession(event)
  setResponseStatus(event, 204)
  return null
})
