// Read-only replay of one of my practice attempts, exactly as it was graded.
import { PRACTICE_ROLES } from '#shared/auth/roles'
import { attemptIdParams } from '#shared/schemas/practice'
import type { AttemptReplay } from '#shared/types/practice'
import { toPresentation } from '~~/server/lib/engine/presentation'
import { caseTitle, regenerateCase } from '~~/server/lib/practice/cases'
import { attemptResultFromRow } from '~~/server/lib/practice/attempts'
import { ownPracticeAttempt } from '~~/server/lib/data/attempts'

export default defineEventHandler(async (event): Promise<AttemptReplay> => {
  const user = await requireRole(event, ...PRACTICE_ROLES)
  const { attemptId } = paramsAs(event, attemptIdParams)
  const db = await useDb()
  const a = await ownPracticeAttempt(db, attemptId, user.id)
  if (!a) notFound('That attempt')
  const row = await db.selectFrom('cases').selectAll().where('id', '=', a.case_id).executeTakeFirstOrThrow()
  const patient = regenerateCase(row)
  const { attemptId: _id, ...result } = attemptResultFromRow(a)
  return {
    attempt: {
      gaze: a.gaze as AttemptReplay['attempt']['gaze'],
      distance: a.distance as AttemptReplay['attempt']['distance'],
      readings: JSON.parse(a.readings_json),
      prisms: JSON.parse(a.prisms_json),
      lights: a.lights as AttemptReplay['attempt']['lights'],
      record: a.record_text,
      trial: a.trial,
      submittedAt: a.submitted_at,
    },
    result,
    case: {
      id: row.id,
      title: caseTitle(row, patient),
      mode: row.mode,
      readScale: row.read_scale === 1,
      presentation: toPresentation(patient, row.mode),
    },
  }
})
