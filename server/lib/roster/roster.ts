// Roster CSV: checks on the uploaded file (size, declared type, content), then
// parsing with papaparse into a per-row report. Importing is all-or-nothing, so
// the report must be clean before anything is written.
import Papa from 'papaparse'
import { hasControlCharacters } from '#shared/schemas/text'
import { z } from 'zod'
import type { RosterReport, RosterRow } from '#shared/types/roster'

export const ROSTER_MAX_BYTES = 1024 * 1024
export const ROSTER_MAX_ROWS = 5000
/** Types browsers and systems declare for a CSV file (Windows says vnd.ms-excel). */
export const ROSTER_TYPES = ['text/csv', 'text/plain', 'application/csv', 'text/comma-separated-values', 'application/vnd.ms-excel', 'text/x-csv']

export interface UploadedFile { filename?: string, type?: string, data: Buffer }

export class RosterFileError extends Error {
  constructor(readonly status: 400 | 413 | 415, message: string, readonly code: string) {
    super(message)
  }
}

/** Declared type and content both have to say "text"; returns the text without a byte-order mark. */
export function rosterText(file: UploadedFile): string {
  if (file.data.length > ROSTER_MAX_BYTES) {
    throw new RosterFileError(413, `The file is ${(file.data.length / 1024 / 1024).toFixed(1)} MB; a roster may be at most 1 MB.`, 'file-too-large')
  }
  const declared = (file.type ?? '').split(';')[0]!.trim().toLowerCase()
  if (!ROSTER_TYPES.includes(declared)) {
    throw new RosterFileError(415, `That file is ${declared ? `"${declared}"` : 'of no stated type'}, not a CSV. Save the roster as CSV (comma-separated values) and upload that.`, 'not-csv')
  }
  if (file.data.length === 0) throw new RosterFileError(400, 'The file is empty.', 'empty-file')
  let text: string
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(file.data)
  }
  catch {
    throw new RosterFileError(415, 'The file is not UTF-8 text. Save the roster as CSV (UTF-8) and upload that.', 'not-text')
  }
  // control characters other than tab, CR and LF mean a binary file (a spreadsheet, an image…)
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u0008\u000B\u000C\u000E-\u001F]/.test(text)) {
    throw new RosterFileError(415, 'The file holds binary data, not text. Save the roster as CSV and upload that.', 'not-text')
  }
  return text.replace(/^\uFEFF/, '')
}

const HEADER_NAMES: Record<string, 'name' | 'email' | 'cohort'> = {
  'name': 'name',
  'full name': 'name',
  'student': 'name',
  'student name': 'name',
  'email': 'email',
  'e-mail': 'email',
  'email address': 'email',
  'e-mail address': 'email',
  'cohort': 'cohort',
  'cohort name': 'cohort',
}

const emailCheck = z.email()

export interface RosterContext {
  /** Every cohort, to tell "unknown" from "not yours". */
  cohorts: { id: number, name: string }[]
  /** Cohorts the uploader may add students to. */
  assignable: number[]
  /** Used for rows that name no cohort. */
  defaultCohortId: number | null
  /** E-mails that already have an account (lower case). */
  existingEmails: Set<string>
}

/** Parse and check a roster; throws RosterFileError when the file as a whole is unusable. */
export function checkRoster(text: string, ctx: RosterContext): RosterReport {
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: false })
  const lines = parsed.data
  const header = (lines[0] ?? []).map(h => HEADER_NAMES[h.trim().toLowerCase()])
  const col = (k: 'name' | 'email' | 'cohort') => header.indexOf(k)
  if (col('name') < 0 || col('email') < 0) {
    throw new RosterFileError(400, 'The first line must name the columns: name, e-mail and (optionally) cohort.', 'roster-header')
  }
  const byName = new Map(ctx.cohorts.map(c => [c.name.trim().toLowerCase(), c]))
  const defaultCohort = ctx.defaultCohortId ? ctx.cohorts.find(c => c.id === ctx.defaultCohortId) ?? null : null
  const firstLineOf = new Map<string, number>()
  const rows: RosterRow[] = []

  lines.slice(1).forEach((fields, i) => {
    if (fields.every(f => !f.trim())) return
    const line = i + 2
    const name = (fields[col('name')] ?? '').trim()
    const email = (fields[col('email')] ?? '').trim().toLowerCase()
    const cohortText = col('cohort') >= 0 ? (fields[col('cohort')] ?? '').trim() : ''
    const problems: string[] = []
    if (!name) problems.push('Name is missing.')
    else if (hasControlCharacters(fields[col('name')] ?? '')) problems.push('Name contains a line break, tab or other control character.')
    else if (name.length > 120) problems.push('Name is longer than 120 characters.')
    if (!email) problems.push('E-mail is missing.')
    else if (!emailCheck.safeParse(email).success) problems.push(`“${email}” is not a valid e-mail address.`)
    else if (firstLineOf.has(email)) problems.push(`Duplicate: ${email} is already on line ${firstLineOf.get(email)}.`)
    else if (ctx.existingEmails.has(email)) problems.push(`${email} already has a Cyclodial account.`)
    if (email && !firstLineOf.has(email)) firstLineOf.set(email, line)

    let cohort: RosterRow['cohort'] = null
    if (cohortText) {
      const found = byName.get(cohortText.toLowerCase())
      if (!found) problems.push(`Unknown cohort “${cohortText}”.`)
      else if (!ctx.assignable.includes(found.id)) problems.push(`You cannot add students to the ${found.name}: you do not teach it.`)
      else cohort = { id: found.id, name: found.name }
    }
    else if (defaultCohort) cohort = { id: defaultCohort.id, name: defaultCohort.name }
    else problems.push('No cohort: name one in a cohort column, or choose a cohort for rows without one.')

    rows.push({ line, name, email, cohort, problems })
  })
  if (!rows.length) throw new RosterFileError(400, 'The file has a header but no students.', 'roster-empty')
  if (rows.length > ROSTER_MAX_ROWS) throw new RosterFileError(400, `A roster may list at most ${ROSTER_MAX_ROWS} students.`, 'roster-too-long')
  const invalid = rows.filter(r => r.problems.length).length
  return { rows, total: rows.length, valid: rows.length - invalid, invalid, canImport: invalid === 0 }
}
