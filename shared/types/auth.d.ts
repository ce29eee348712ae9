import type { Role } from '../utils/roles'

declare module '#auth-utils' {
  interface User {
    id: string
    email: string
    name: string
    role: Role
  }
  interface UserSession {
    loggedInAt: string
  }
  /** Sealed in the cookie, never sent to the browser by the session endpoint. */
  interface SecureSessionData {
    /** The person's session epoch at sign-in (server/utils/auth.ts); a moved-on epoch ends the session. */
    epoch: number
  }
}

export {}
