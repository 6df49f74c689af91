// One of my practice cases: the presentation, the autosaved bench, the patient's
// turns so far and every attempt with its truth (the truth is due once submitted).
import { PRACTICE_ROLES } from '#shared/auth/roles'
import type { Distance, Gaze } from '#shared/engine/types'
import { caseIdParams } from '#shared/schemas/practice'
import type { PracticeCaseDetail } from '#shared/types/practice'
import { caseTurns, findOwnedCase, practiceCaseView, regenerateCase } from '~~/server/lib/practice/cases'
import { attemptResultFromRow } from '~~/server/lib/practice/attempts'
import { practiceAttemptsOnCase } from '~~/server/lib/data/attempts'

export default defineEventHandler(async (event): Promise<PracticeCaseDetail> => {
  const user = await requireRole(event, ...PRACTICE_ROLES)
  const { id } = paramsAs(event, caseIdParams)
  const db = await useDb()
  const row = await findOwnedCase(db, id, user.id)
  if (!row) notFound('That practice case')
  const patient = regenerateCase(row)
  const attempts = await practiceAttemptsOnCase(db, row.id, user.id)
  const turns = await caseTurns(db, row.id)
  return {
    ...practiceCaseView(row, patient, attempts.length > 0),
    draft: row.draft_json ? JSON.parse(row.draft_json) : null,
    turns: turns.map(t => t.result),
    attempts: attempts.map(a => ({
      ...attemptResultFromRow(a),
      submittedAt: a.submitted_at,
      gaze: a.gaze as Gaze,
      distance: a.distance as Distance,
      trial: a.trial,
    })),
  }
})
