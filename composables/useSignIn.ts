// After any route that starts a session (sign-in, sign-up, invitation, reset): read the new
// session, forget the previous person's cached data, and go on.
export function useSignIn() {
  const { fetch: refreshSession } = useUserSession()
  return async function enter(path = '/') {
    await refreshSession()
    clearNuxtData()
    await navigateTo(path)
  }
}
