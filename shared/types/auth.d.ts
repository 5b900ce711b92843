// The shape of the sealed session cookie (nuxt-auth-utils). Only ids travel in it: the role
// shown to the client is a hint; the server re-reads the user on every request.
declare module '#auth-utils' {
  interface User {
    id: number
    shopId: number
    name: string
    role: 'operator' | 'crib_manager' | 'owner'
  }
  interface UserSession {
    loggedInAt?: number
  }
}

export {}
