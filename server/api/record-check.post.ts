// The record checker: grade a written record against a known finding (signed
// degrees, positive = excyclo). Tutors use it to mark written practical exams.
import { recordCheckBodySchema } from '#shared/schemas/practice'
import type { RecordCheckResult } from '#shared/types/practice'
import { gradeRecord } from '~~/server/lib/engine/grader'

export default defineEventHandler(async (event): Promise<RecordCheckResult> => {
  await requireRole(event, 'tutor', 'lecturer', 'admin')
  const body = await readBodyAs(event, recordCheckBodySchema)
  const r = gradeRecord({
    record: body.record,
    expected: body.torsion,
    gaze: body.gaze,
    distance: body.distance,
    readings: body.readings,
    shouldNotTest: body.notTestable,
    options: { tolerance: body.tolerance },
  })
  return { readAs: r.readAs, parsed: r.parsed, marks: r.marks, score: r.score, points: r.points, cap: r.cap, slips: r.slips, modelRecord: r.modelRecord, explanation: r.explanation }
})
