// Staff replay of one attempt: the bench state the learner submitted and the
// result exactly as first shown (recordAttempt stores it; nothing is regraded),
// plus the case's presentation so a read-only bench can draw the patient's view.
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'
import type { PatientTurnsResult, Presentation } from '#shared/engine/presentation'
import type { Distance, Gaze, Lights, Mode, PerEye, Prism } from '#shared/engine/types'
import type { AttemptResult } from '#shared/types/practice'
import { attemptResultFromRow } from '~~/server/lib/practice/attempts'
import { caseTurns, regenerateCase } from '~~/server/lib/practice/cases'
import { toPresentation } from '~~/server/lib/engine/presentation'
import type { ReviewScope } from './scope'

export interface StaffReplay {
  attempt: { id: number, gaze: Gaze, distance: Distance, readings: PerEye<number>, prisms: Prism[], lights: Lights, record: string, trial: number | null, submittedAt: string }
  result: AttemptResult
  case: { id: number, title: string, templateId: string | null, condition: string, difficulty: string, mode: Mode, readScale: boolean, presentation: Presentation | null }
  /** Patient-turns: where the patient left the rods on the trial the learner read. */
  turns: PatientTurnsResult[]
  learner: { id: number, name: string }
  cohort: { id: number, name: string } | null
  kind: 'practice' | 'quiz'
  quizId: number | null
}

/** The replay, or null when the attempt does not exist or lies outside the caller's cohorts. */
export async function staffReplay(db: Kysely<Database>, attemptId: number, scope: ReviewScope): Promise<StaffReplay | null> {
  let q = db.selectFrom('attempts')
    .innerJoin('cases', 'cases.id', 'attempts.case_id')
    .innerJoin('users', 'users.id', 'attempts.learner_id')
    .leftJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .selectAll('attempts')
    .select(['cases.spec_json', 'cases.read_scale', 'users.name as learner_name', 'cohorts.name as cohort_name'])
    .where('attempts.id', '=', attemptId)
  if (scope.cohortIds) q = q.where('attempts.cohort_id', 'in', scope.cohortIds.length ? scope.cohortIds : [-1])
  const a = await q.executeTakeFirst()
  if (!a) return null

  let made: ReturnType<typeof regenerateCase> | null = null
  try {
    made = regenerateCase({ template_id: a.template_id, spec_json: a.spec_json, seed: a.seed, generator_version: a.generator_version })
  }
  catch {
    // an attempt whose case can no longer be rebuilt still shows its stored result
  }
  return {
    attempt: {
      id: a.id,
      gaze: a.gaze as Gaze,
      distance: a.distance as Distance,
      readings: JSON.parse(a.readings_json),
      prisms: JSON.parse(a.prisms_json),
      lights: (a.lights === 'on' ? 'on' : 'dim') as Lights,
      record: a.record_text,
      trial: a.trial,
      submittedAt: a.submitted_at,
    },
    result: attemptResultFromRow(a),
    case: {
      id: a.case_id,
      title: made?.label ?? a.condition,
      templateId: a.template_id,
      condition: a.condition,
      difficulty: a.difficulty,
      mode: a.mode,
      readScale: a.read_scale === 1,
      presentation: made ? toPresentation(made, a.mode) : null,
    },
    turns: a.trial ? (await caseTurns(db, a.case_id)).filter(t => t.trial === a.trial).map(t => t.result) : [],
    learner: { id: a.learner_id, name: a.learner_name },
    cohort: a.cohort_id && a.cohort_name ? { id: a.cohort_id, name: a.cohort_name } : null,
    kind: a.kind,
    quizId: a.quiz_id,
  }
}
