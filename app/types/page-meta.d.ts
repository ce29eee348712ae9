import type { Role } from '#shared/utils/roles'

declare module '#app' {
  interface PageMeta {
    /** Roles that may open the page; the server still checks every request. */
    roles?: Role[]
    /** Open without signing in. */
    public?: boolean
  }
}

export {}
