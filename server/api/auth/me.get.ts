// GET /api/auth/me (signed in): `{ user, home }`
import { homeFor } from '#shared/auth/roles'
import type { SignedInReply } from '#shared/types/admin'

export default defineEventHandler(async (event): Promise<SignedInReply> => {
  const user = await requireSignedIn(event)
  return { user, home: homeFor(user.role) }
})
