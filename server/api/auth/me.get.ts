import { homeFor } from '#shared/auth/roles'

export default defineEventHandler(async (event) => {
  const user = await requireSignedIn(event)
  return { user, home: homeFor(user.role) }
})
