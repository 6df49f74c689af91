import { ROSTER_ROLES } from '#shared/auth/roles'
import { readRoster } from '~~/server/lib/roster/upload'

// Check a roster CSV without importing anything: a report line per row.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...ROSTER_ROLES)
  return readRoster(event, user)
})
