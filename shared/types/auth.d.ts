// Types the session cookie carries (nuxt-auth-utils). Only public facts about
// the signed-in person; the server re-reads the role from the database.
import type { Role } from '../auth/roles'

declare module '#auth-utils' {
  interface User {
    id: number
    email: string
    name: string
    role: Role
  }
}

export {}
