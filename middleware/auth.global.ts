// Sends signed-out visitors to sign in (and back afterwards), and keeps people off pages
// their role cannot use. This only spares them a dead end: the server decides every request.
import { roleAtLeast, type Role } from '#shared/kerf/roles'

declare module '#app' {
  interface PageMeta {
    /** Open without signing in (sign-in, sign-up, invitation and reset pages). */
    public?: boolean
    /** The lowest role that may open the page. */
    role?: Role
  }
}

export default defineNuxtRouteMiddleware((to) => {
  if (to.meta.public) return
  const { loggedIn, user } = useUserSession()
  if (!loggedIn.value || !user.value) {
    return navigateTo({ path: '/login', query: to.fullPath === '/' ? {} : { next: to.fullPath } })
  }
  if (to.meta.role && !roleAtLeast(user.value.role, to.meta.role)) {
    return navigateTo('/')
  }
})
