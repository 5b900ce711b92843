// The client asks nuxt-auth-utils' own route (/api/_auth/session) who is signed in. That route
// only opens the cookie, so an ended session would still look signed in to the pages: check its
// row too, and clear a cookie whose session is over.
export default defineNitroPlugin(() => {
  sessionHooks.hook('fetch', async (session, event) => {
    if (await sessionHolds(session)) return
    await clearUserSession(event)
    throw createError({ statusCode: 401, statusMessage: 'Your session has ended. Sign in again.' })
  })
})
