// recordAttempt: the ONE way an attempt is graded and stored — practice now,
// quizzes and the demo seed too. It regenerates the case from its row (template
// or spec snapshot + seed + generator version), grades with the engine's
// gradeAttempt and writes the attempt with its slips in one transaction.
// Nitro-free (db passed in, errors typed) so scripts and the seed can call it.
import type { Kysely } from 'kysely'
import type { EyeRecord, GazeSection } from '#shared/engine/parser'
import { readAsLine } from '#shared/engine/parser'
import { cappedPoints } from '#shared/engine/marking'

import type { Eye, Gaze, Lights, PerEye, Prism } from '#shared/engine/types'

import { ruleSwapEvidence } from '#shared/engine/slips'
import type { RuleSwapAttempt } from '#shared/engine/slips'
import { slipSetOf } from '#shared/review/slip-set'
import type { AttemptResult } from '#shared/types/practice'
import type { AttemptKind, AttemptRow, CaseRow, Database } from '~~/db/schema'
import type { AttemptGrade, AttemptInput } from '~~/server/lib/engine/attempt'
import { gradeAttempt } from '~~/server/lib/engine/attempt'
import type { GradeOptions } from '~~/server/lib/engine/grader'
import type { Case } from '~~/server/lib/engine/types'
import { CaseInputError, regenerateCase } from './cases'
import { nowIso } from '~~/server/utils/clock'

export interface RecordAttemptInput {
  /** The case row, already loaded and checked for access by the caller. */
  caseRow: CaseRow
  learnerId: number
  kind: AttemptKind
  /** What the learner submitted. */
  attempt: AttemptInput
  /** Patient-turns: the trial whose rod positions the learner read (required there). */
  trial?: number | null
  /** Quiz settings: tolerance, readingTolerance, weights. Practice uses the defaults. */
  options?: GradeOptions
  /** Default: the case row's quiz/practice-set ids. */
  quizId?: number | null
  quizItemId?: number | null
  practiceSetId?: number | null
  /** Default: the learner's cohort now (students only; staff practising have none). */
  cohortId?: number | null
  startedAt?: string | null
  /** Default now; the demo seed back-dates. */
  submittedAt?: string
}

export interface RecordedAttempt {
  attemptId: number
  grade: AttemptGrade
  patient: Case
  submittedAt: string
  trial: number | null
}

/** The section of a record the grader marked (the tested gaze when several are written). */
function gradedSection(sections: GazeSection[], gaze: Gaze): GazeSection {
  if (sections.length > 1) return sections.find(s => s.gaze === gaze) ?? sections[0]!
  return sections[0]!
}

/** Recorded amount minus the true magnitude, degrees; "no torsion" counts as 0; null when not recorded. */
export function amountError(r: EyeRecord | undefined, truth: number): number | null {
  if (!r) return null
  const a = r.direction === 'none' ? 0 : r.amount
  if (a === null) return null
  return Math.round((a - Math.abs(truth)) * 10) / 10
}

/** The direction the graded section of a record gives each eye (null when that eye is not recorded). */
export function recordedDirections(grade: Pick<AttemptGrade, 'parsed'>, gaze: Gaze): PerEye<string | null> {
  const section = gradedSection(grade.parsed.sections, gaze)
  return { RE: section.eyes.RE?.direction ?? null, LE: section.eyes.LE?.direction ?? null }
}

/** What the slip-pattern rules need from a graded attempt (rule-swap evidence included: shared/engine/slips.ts). */
export function ruleSwapAttemptOf(grade: Pick<AttemptGrade, 'parsed' | 'slips' | 'truth'>, gaze: Gaze): RuleSwapAttempt {
  return { slips: grade.slips, torsion: grade.truth.torsion, recorded: recordedDirections(grade, gaze) }
}

async function learnerCohort(db: Kysely<Database>, learnerId: number): Promise<number | null> {
  const row = await db.selectFrom('cohort_members')
    .innerJoin('users', 'users.id', 'cohort_members.user_id')
    .select('cohort_members.cohort_id')
    .where('cohort_members.user_id', '=', learnerId).where('users.role', '=', 'student')
    .orderBy('cohort_members.created_at', 'desc')
    .executeTakeFirst()
  return row?.cohort_id ?? null
}

/**
 * Patient-turns: the patient's setting comes from the stored turn, so the attempt
 * must be at that turn's gaze and distance, and its prisms and lights (when given)
 * must be the turn's. Returns the turn's prisms and lights.
 */
async function turnFor(db: Kysely<Database>, row: CaseRow, a: AttemptInput, trial: number | null | undefined) {
  if (!trial) throw new CaseInputError('trial', 'In patient-turns mode, say which of the patient\'s turns you read (trial).')
  const turn = await db.selectFrom('case_turns').selectAll().where('case_id', '=', row.id).where('trial', '=', trial).executeTakeFirst()
  if (!turn) throw new CaseInputError('trial', `The patient has not made turn ${trial} on this case yet.`)
  if (turn.gaze !== a.gaze) throw new CaseInputError('gaze', `Turn ${trial} was made in ${turn.gaze} gaze, not ${a.gaze}.`)
  if (turn.distance !== a.distance) throw new CaseInputError('distance', `Turn ${trial} was made at ${turn.distance}, not ${a.distance}.`)
  const prisms = JSON.parse(turn.prisms_json) as Prism[]
  const key = (ps: readonly Prism[]) => ps.map(p => `${p.eye}${p.base}${p.power}`).sort().join('|')
  if (a.prisms && key(a.prisms) !== key(prisms)) throw new CaseInputError('prisms', `Turn ${trial} was made with other prisms in the frame.`)
  if (a.lights && a.lights !== turn.lights) throw new CaseInputError('lights', `Turn ${trial} was made with the room lights ${turn.lights === 'on' ? 'on' : 'dimmed'}.`)
  return { prisms, lights: turn.lights as Lights }
}

export async function recordAttempt(db: Kysely<Database>, input: RecordAttemptInput): Promise<RecordedAttempt> {
  const row = input.caseRow
  const patient = regenerateCase(row)
  let attempt: AttemptInput = { ...input.attempt, prisms: input.attempt.prisms ?? [], lights: input.attempt.lights ?? 'dim' }
  let trial: number | null = null
  if (row.mode === 'patient-turns') {
    const turn = await turnFor(db, row, input.attempt, input.trial)
    attempt = { ...attempt, ...turn }
    trial = input.trial!
  }
  const grade = gradeAttempt(patient, attempt, { mode: row.mode, trial: trial ?? undefined, options: input.options })
  const submittedAt = input.submittedAt ?? nowIso()
  const cohortId = input.cohortId !== undefined ? input.cohortId : await learnerCohort(db, input.learnerId)
  const section = gradedSection(grade.parsed.sections, attempt.gaze)
  const perEye = <T>(f: (eye: Eye) => T): PerEye<T> => ({ RE: f('RE'), LE: f('LE') })
  const recorded = recordedDirections(grade, attempt.gaze)
  const errors = perEye(e => amountError(section.eyes[e], grade.truth.torsion[e]))
  const quizId = input.quizId !== undefined ? input.quizId : row.quiz_id
  const startedAt = input.startedAt ?? null
  const duration = startedAt ? Math.max(0, Date.parse(submittedAt) - Date.parse(startedAt)) : null

  const write = async (trx: Kysely<Database>) => {
    const { id } = await trx.insertInto('attempts').values({
      case_id: row.id,
      learner_id: input.learnerId,
      cohort_id: cohortId,
      kind: input.kind,
      quiz_id: quizId,
      quiz_item_id: input.quizItemId !== undefined ? input.quizItemId : row.quiz_item_id,
      practice_set_id: input.practiceSetId !== undefined ? input.practiceSetId : row.practice_set_id,
      template_id: row.template_id,
      condition: row.condition,
      difficulty: row.difficulty,
      mode: row.mode,
      seed: row.seed,
      generator_version: row.generator_version,
      gaze: attempt.gaze,
      distance: attempt.distance,
      readings_json: JSON.stringify(attempt.readings),
      prisms_json: JSON.stringify(attempt.prisms),
      lights: attempt.lights!,
      trial,
      record_text: attempt.record,
      parsed_json: JSON.stringify(grade.parsed),
      marks_json: JSON.stringify(grade.marks),
      interpretation_json: attempt.interpretation ? JSON.stringify({ given: attempt.interpretation, result: grade.interpretation }) : null,
      score: grade.score,
      points_earned: grade.points.earned,
      points_possible: grade.points.possible,
      slips_json: JSON.stringify(grade.slips),
      truth_json: JSON.stringify(grade.truth),
      re_true_direction: grade.truth.directions.RE,
      le_true_direction: grade.truth.directions.LE,
      re_recorded_direction: recorded.RE,
      le_recorded_direction: recorded.LE,
      re_amount_error: errors.RE,
      le_amount_error: errors.LE,
      started_at: startedAt,
      submitted_at: submittedAt,
      duration_ms: duration,
      read_as: grade.readAs,
      model_record: grade.modelRecord,
      explanation_json: JSON.stringify(grade.explanation),
      // the same slips as the attempt_slips rows below, as one key for the per-learner counts
      slip_set: slipSetOf(grade.slips),
      // a one-eye reversal that tells a rule swap from recording the image (migration 0012)
      rule_swap_eye: ruleSwapEvidence({ slips: grade.slips, torsion: grade.truth.torsion, recorded }),
    }).returning('id').executeTakeFirstOrThrow()
    if (grade.slips.length) {
      await trx.insertInto('attempt_slips').values(grade.slips.map(s => ({
        attempt_id: id,
        learner_id: input.learnerId,
        cohort_id: cohortId,
        kind: input.kind,
        quiz_id: quizId,
        template_id: row.template_id,
        condition: row.condition,
        code: s.code,
        eye: s.eye ?? null,
        created_at: submittedAt,
      }))).execute()
    }
    await trx.updateTable('cases').set({ updated_at: submittedAt }).where('id', '=', row.id).execute()
    return id
  }
  const attemptId = db.isTransaction ? await write(db) : await db.transaction().execute(write)
  return { attemptId, grade, patient, submittedAt, trial }
}

/** The learner-facing result of a fresh grade (practice shows it at once; quizzes after release). */
export function attemptResultOf(attemptId: number, grade: AttemptGrade): AttemptResult {
  const out: AttemptResult = {
    attemptId,
    readAs: grade.readAs,
    marks: grade.marks,
    score: grade.score,
    points: grade.points,
    cap: grade.cap,
    slips: grade.slips,
    explanation: grade.explanation,
    modelRecord: grade.modelRecord,
    truth: grade.truth,
  }
  if (grade.interpretation) out.interpretation = grade.interpretation
  return out
}

/** The same result rebuilt from a stored row, exactly as it was first shown (nothing regraded). */
export function attemptResultFromRow(row: AttemptRow): AttemptResult {
  const parsed = JSON.parse(row.parsed_json)
  const marks = JSON.parse(row.marks_json)
  const slips = JSON.parse(row.slips_json)
  // the cap is shown only where the stored points were capped (rows graded before the cap keep their score)
  const capped = cappedPoints(marks, slips)
  const out: AttemptResult = {
    attemptId: row.id,
    readAs: row.read_as ?? readAsLine(parsed),
    marks,
    score: row.score,
    points: { earned: row.points_earned, possible: row.points_possible },
    cap: capped.cap && Math.abs(capped.earned - row.points_earned) < 1e-9 ? capped.cap : null,
    slips,
    explanation: row.explanation_json ? JSON.parse(row.explanation_json) : [],
    modelRecord: row.model_record ?? JSON.parse(row.truth_json).modelRecord,
    truth: JSON.parse(row.truth_json),
  }
  const interp = row.interpretation_json ? JSON.parse(row.interpretation_json) as { result?: AttemptResult['interpretation'] } : null
  if (interp?.result) out.interpretation = interp.result
  return out
}
