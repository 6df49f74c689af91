// Reads a roster upload (multipart: `file`, optional `cohortId`) and builds its
// report. Size is checked from the request's length before the body is read.
import type { H3Event } from 'h3'
import type { SessionUserData } from '#shared/auth/roles'
import type { RosterReport } from '#shared/types/roster'
import { RosterFileError, ROSTER_MAX_BYTES, checkRoster, rosterText } from './roster'
import { assignableCohortIds } from '~~/server/lib/quiz/access'

/** Room for the multipart envelope and the other form fields around the file. */
const ENVELOPE_BYTES = 64 * 1024

function fileProblem(e: RosterFileError): never {
  throw createError({ statusCode: e.status, statusMessage: e.status === 413 ? 'Payload Too Large' : e.status === 415 ? 'Unsupported Media Type' : 'Bad Request', message: e.message, data: { code: e.code, fields: [{ path: 'file', message: e.message }] } })
}

export async function readRoster(event: H3Event, user: SessionUserData): Promise<RosterReport> {
  const length = Number(getRequestHeader(event, 'content-length') ?? 'NaN')
  if (!Number.isFinite(length)) {
    // without a length the body could be any size: refuse before reading it
    throw createError({ statusCode: 411, statusMessage: 'Length Required', message: 'The upload must state its length.', data: { code: 'length-required' } })
  }
  if (length > ROSTER_MAX_BYTES + ENVELOPE_BYTES) {
    fileProblem(new RosterFileError(413, `The upload is ${(length / 1024 / 1024).toFixed(1)} MB; a roster may be at most 1 MB.`, 'file-too-large'))
  }
  if (!(getRequestHeader(event, 'content-type') ?? '').toLowerCase().startsWith('multipart/form-data')) {
    badRequest([{ path: 'file', message: 'Send the roster as a file upload (multipart/form-data, field "file").' }], 'not-multipart')
  }
  const parts = await readMultipartFormData(event) ?? []
  const file = parts.find(p => p.name === 'file' && p.filename !== undefined)
  if (!file) badRequest([{ path: 'file', message: 'Choose a CSV file to upload.' }], 'no-file')
  const cohortField = parts.find(p => p.name === 'cohortId')?.data.toString('utf8').trim()
  let defaultCohortId: number | null = null
  if (cohortField) {
    defaultCohortId = Number(cohortField)
    if (!Number.isInteger(defaultCohortId) || defaultCohortId <= 0) badRequest([{ path: 'cohortId', message: 'Choose a cohort from the list.' }])
  }

  const db = await useDb()
  const assignable = await assignableCohortIds(db, user)
  if (defaultCohortId && !assignable.includes(defaultCohortId)) {
    badRequest([{ path: 'cohortId', message: 'You cannot add students to that cohort.' }])
  }
  try {
    const text = rosterText({ filename: file.filename, type: file.type, data: file.data })
    const cohorts = await db.selectFrom('cohorts').select(['id', 'name']).execute()
    const users = await db.selectFrom('users').select('email').execute()
    return checkRoster(text, { cohorts, assignable, defaultCohortId, existingEmails: new Set(users.map(u => u.email.toLowerCase())) })
  }
  catch (e) {
    if (e instanceof RosterFileError) fileProblem(e)
    throw e
  }
}
