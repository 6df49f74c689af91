import type { Role } from '#shared/auth/roles'

declare module '#app' {
  interface PageMeta {
    /** Roles allowed on this page; omit for any signed-in person. */
    roles?: readonly Role[]
    /** Open to everyone, signed in or not (sign-in, invitation, reset pages). */
    public?: boolean
  }
}

export {}
