// POST /api/roster/preview (tutor, lecturer, admin): multipart `file` (CSV, ≤ 1 MB;
// `413` if larger, `415` if not CSV text) and optional `cohortId` → `{ rows: [{ line,
// name, email, cohort, problems }], total, valid, invalid, canImport }`
import { ROSTER_ROLES } from '#shared/auth/roles'
import { readRoster } from '~~/server/lib/roster/upload'
import type { RosterReport } from '#shared/types/roster'

// Check a roster CSV without importing anything: a report line per row.
export default defineEventHandler(async (event): Promise<RosterReport> => {
  const user = await requireRole(event, ...ROSTER_ROLES)
  return readRoster(event, user)
})
