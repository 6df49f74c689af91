// Staff replay of one attempt: the bench state the learner submitted and the
// result, for the read-only bench. The case is regenerated from its stored
// template + seed + generator version (or its hand-authored snapshot), exactly
// as the attempt was graded; the explanation is re-derived by the same grader.
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'
import { readAsLine } from '#shared/engine/parser'
import type { ParsedRecord } from '#shared/engine/parser'
import type { Presentation } from '#shared/engine/presentation'
import type { Slip } from '#shared/engine/slips'
import type { Distance, Gaze, Lights, Mode, PerEye, Prism } from '#shared/engine/types'
import { gradeAttempt } from '../engine/attempt'
import { caseFromSpec, generateCase } from '../engine/generator'
import { toPresentation } from '../engine/presentation'
import type { Case } from '../engine/types'
import type { ReviewScope } from './scope'

export interface StaffReplay {
  attempt: { id: number, gaze: Gaze, distance: Distance, readings: PerEye<number>, prisms: Prism[], lights: Lights, record: string, trial: number | null, submittedAt: string }
  result: { readAs: string, marks: unknown[], score: number, points: { earned: number, possible: number }, slips: Slip[], explanation: string[], modelRecord: string | null, truth: unknown, interpretation?: unknown }
  case: { id: number, title: string, templateId: string | null, condition: string, difficulty: string, mode: Mode, readScale: boolean, presentation: Presentation | null }
  learner: { id: number, name: string }
  cohort: { id: number, name: string } | null
  kind: 'practice' | 'quiz'
  quizId: number | null
}

function parse<T>(text: string | null, fallback: T): T {
  if (!text) return fallback
  try {
    return JSON.parse(text) as T
  }
  catch {
    return fallback
  }
}

function regenerate(c: { template_id: string | null, seed: string, generator_version: number, spec_json: string | null }): Case | null {
  try {
    if (c.spec_json) {
      const made = caseFromSpec(JSON.parse(c.spec_json))
      return made.ok ? made.case : null
    }
    return c.template_id ? generateCase(c.template_id, c.seed, c.generator_version) : null
  }
  catch {
    return null
  }
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

  const parsed = parse<ParsedRecord | null>(a.parsed_json, null)
  const truth = parse<Record<string, unknown> | null>(a.truth_json, null)
  const readings = parse<PerEye<number>>(a.readings_json, { RE: 90, LE: 90 })
  const prisms = parse<Prism[]>(a.prisms_json, [])
  const lights = (a.lights === 'on' ? 'on' : 'dim') as Lights
  const made = regenerate({ template_id: a.template_id, seed: a.seed, generator_version: a.generator_version, spec_json: a.spec_json })
  let explanation: string[] = []
  if (made) {
    const regraded = gradeAttempt(made, {
      gaze: a.gaze as Gaze,
      distance: a.distance as Distance,
      readings,
      prisms,
      lights,
      record: a.record_text,
    }, { mode: a.mode, trial: a.trial ?? undefined })
    explanation = regraded.explanation
  }
  return {
    attempt: { id: a.id, gaze: a.gaze as Gaze, distance: a.distance as Distance, readings, prisms, lights, record: a.record_text, trial: a.trial, submittedAt: a.submitted_at },
    result: {
      readAs: parsed ? readAsLine(parsed) : '',
      marks: parse<unknown[]>(a.marks_json, []),
      score: a.score,
      points: { earned: a.points_earned, possible: a.points_possible },
      slips: parse<Slip[]>(a.slips_json, []),
      explanation,
      modelRecord: typeof truth?.modelRecord === 'string' ? truth.modelRecord : null,
      truth,
      ...(a.interpretation_json ? { interpretation: parse(a.interpretation_json, null) } : {}),
    },
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
    learner: { id: a.learner_id, name: a.learner_name },
    cohort: a.cohort_id && a.cohort_name ? { id: a.cohort_id, name: a.cohort_name } : null,
    kind: a.kind,
    quizId: a.quiz_id,
  }
}
