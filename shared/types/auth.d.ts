// The shape of the sealed session cookie (nuxt-auth-utils). Only ids travel in it: the role
// shown to the client is a hint; the server re-reads the user on every request. `secure.sid`
// names the session's row (server/utils/platform/auth.ts) and never reaches the client.
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
  interface SecureSessionData {
    sid?: string
  }
}

export {}
