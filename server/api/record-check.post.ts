// The record checker: grade a written record against a known finding (signed
// degrees, positive = excyclo). Tutors use it to mark written practical exams.
import { recordCheckSchema } from '#shared/engine/schemas'
import type { RecordCheckResult } from '#shared/types/practice'
import { gradeKnownFinding } from '~~/server/utils/engine/attempt'

export default defineEventHandler(async (event): Promise<RecordCheckResult> => {
  await requireRole(event, 'tutor', 'lecturer', 'admin')
  const body = await readBodyAs(event, recordCheckSchema)
  const r = gradeKnownFinding(body)
  return { readAs: r.readAs, parsed: r.parsed, marks: r.marks, score: r.score, points: r.points, slips: r.slips, modelRecord: r.modelRecord, explanation: r.explanation }
})
