// GET /api/auth/me (signed in): `{ user, home }`
import { homeFor } from '#shared/auth/roles'

export default defineEventHandler(async (event) => {
  const user = await requireSignedIn(event)
  return { user, home: homeFor(user.role) }
})
