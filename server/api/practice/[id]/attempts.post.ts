// Submit an attempt on my practice case: graded and stored by recordAttempt; in
// practice the result, with the truth, comes back at once.
import { PRACTICE_ROLES } from '#shared/auth/roles'
import { caseIdParams, practiceAttemptSchema } from '#shared/schemas/practice'
import type { PracticeAttemptResult } from '#shared/types/practice'
import { withCaseErrors } from '~~/server/lib/practice/http'
import { findOwnedCase, practiceCaseView } from '~~/server/lib/practice/cases'
import { attemptResultOf, recordAttempt } from '~~/server/lib/practice/attempts'
import { hasAttemptOnCase } from '~~/server/lib/data/attempts'

export default defineEventHandler(async (event): Promise<PracticeAttemptResult> => {
  const user = await requireRole(event, ...PRACTICE_ROLES)
  const { id } = paramsAs(event, caseIdParams)
  const { trial, ...attempt } = await readBodyAs(event, practiceAttemptSchema)
  const db = await useDb()
  const row = await findOwnedCase(db, id, user.id)
  if (!row) notFound('That practice case')
  const earlier = await hasAttemptOnCase(db, row.id, user.id)
  const recorded = await withCaseErrors(() => recordAttempt(db, {
    caseRow: row,
    learnerId: user.id,
    kind: 'practice',
    attempt,
    trial: row.mode === 'patient-turns' ? trial : null,
    // the case was opened for this attempt; later attempts on it have no known start
    startedAt: earlier ? null : row.created_at,
  }))
  setResponseStatus(event, 201)
  // the attempt reveals the case: its heading names the condition from now on
  return { ...attemptResultOf(recorded.attemptId, recorded.grade), caseTitle: practiceCaseView(row, recorded.patient, true).title }
})
