// What the roster upload answers: one report line per data row of the CSV.
import type { Role } from '#shared/auth/roles'

export interface RosterRow {
  /** Line of the file (the header is line 1). */
  line: number
  name: string
  email: string
  cohort: { id: number, name: string } | null
  /** Plain-language problems; an empty list means the row can be imported. */
  problems: string[]
}

export interface RosterReport {
  rows: RosterRow[]
  total: number
  valid: number
  invalid: number
  /** True only when every row is valid: the import is all-or-nothing. */
  canImport: boolean
}

export interface RosterImportResult {
  imported: number
  mailed: number
  message: string
}

/** GET /api/invitations/:token — what the invitation page shows before it is accepted. */
export interface InvitationInfo { email: string, name: string | null, role: Role, roleLabel: string, cohortName: string | null, expiresAt: string }
