// The results of a quiz: one row per assigned student, one cell per item. The
// attempt that counts is the student's last submitted attempt on the item; a
// tutor's overrides replace single criteria; the interpretation step (when the
// quiz asks for it) counts as one more criterion with its own weight. A fundus
// item's attempt is a fundus_attempts row, marked by fundusMarksOf.
import type { Kysely } from 'kysely'
import type { QuizCriterion } from '#shared/schemas/quiz'
import { QUIZ_CRITERIA, criteriaOfKind } from '#shared/schemas/quiz'
import type { FundusGradeResult } from '#shared/engine/fundus/result'
import { cappedPoints } from '#shared/engine/marking'
import type { AttemptRow, Database, QuizItemRow, QuizRow, QuizSittingRow } from '~~/db/schema'
import type { QuizItemConfig } from './items'
import { readItemConfig } from './items'
import { quizStudents } from './access'
import type { EffectiveMark, ItemCell, StudentResult } from '#shared/types/quiz'
import { sittingEnd, sittingStatus } from './timing'
import { fundusMarksOf, loadFundusOverrides } from './fundus-marks'
import type { OverrideRow } from './overrides'

export interface ItemColumn {
  id: number
  position: number
  config: QuizItemConfig
  /** Criteria shown for the item: those that count (weight > 0) and appear in its marks. */
  criteria: QuizCriterion[]
  /** Points available on the item (the largest possible seen, else from the weights). */
  possible: number
}

/** A tutor's overrides on marks: the latest override of each criterion wins (mutates and returns the marks). */
export function applyOverrides(marks: EffectiveMark[], overrides: OverrideRow[]): EffectiveMark[] {
  for (const o of [...overrides].sort((a, b) => a.created_at.localeCompare(b.created_at))) {
    const m = marks.find(x => x.criterion === o.criterion)
    if (!m) continue
    m.override = { previousScore: m.override?.previousScore ?? o.previous_score, reason: o.reason, by: o.actorName, at: o.created_at }
    m.score = o.score
  }
  return marks
}

/** Marks of one attempt as they stand: grader marks + interpretation, with overrides applied. */
export function effectiveMarks(attempt: Pick<AttemptRow, 'marks_json' | 'interpretation_json'>, config: QuizItemConfig, interpretationOn: boolean, overrides: OverrideRow[]): EffectiveMark[] {
  const marks: EffectiveMark[] = (JSON.parse(attempt.marks_json) as { criterion: QuizCriterion, score: number, weight: number, reason: string }[])
    .map(m => ({ criterion: m.criterion, score: m.score, weight: m.weight, reason: m.reason }))
  // the step was marked only where the patient had cover-test findings to interpret;
  // recordAttempt stores { given, result }: the learner's answer and its grade
  if (interpretationOn && attempt.interpretation_json) {
    const interp = (JSON.parse(attempt.interpretation_json) as { result?: { score: number } }).result
    marks.push({
      criterion: 'interpretation',
      score: interp?.score ?? 0,
      weight: config.weights.interpretation,
      reason: 'Three-step interpretation.',
    })
  }
  return applyOverrides(marks, overrides)
}

/**
 * Points of marks as they stand, the quiz's weights applied and then the cap of critical
 * slips (at most half the points while the slip's criterion is not overridden to full marks).
 */
export function pointsOf(marks: EffectiveMark[], slips: readonly { code: string }[] = []): { earned: number, possible: number } {
  const { earned, possible } = cappedPoints(marks, slips)
  return { earned, possible }
}

/**
 * Marks as feedback shows them, with the score and points they make, for either item
 * kind. A student reads a tutor's change inside the mark's reason; staff see each
 * change, with its reason, in the list of changes beside the marks.
 */
export function feedbackMarks(marks: EffectiveMark[], audience: 'student' | 'staff', slips: readonly { code: string }[] = []) {
  const { cap, ...points } = cappedPoints(marks, slips)
  return {
    marks: marks.map(m => ({
      criterion: m.criterion,
      score: m.score,
      weight: m.weight,
      reason: m.override && audience === 'student' ? `${m.reason} Changed by your tutor: ${m.override.reason}` : m.reason,
      overridden: !!m.override,
    })),
    score: points.possible ? points.earned / points.possible : 0,
    points,
    cap,
  }
}

/** Points an item is worth before anyone sits it: the weights of the criteria a normal case marks. */
function nominalPossible(config: QuizItemConfig, interpretationOn: boolean): number {
  if (config.kind === 'fundus') return config.weights.fundusAngle + config.weights.fundusFinding
  const record: QuizCriterion[] = ['measurement', 'direction', 'amount', 'eye', 'test', 'gaze', 'distance']
  return record.reduce((a, c) => a + config.weights[c], 0) + (interpretationOn ? config.weights.interpretation : 0)
}

export async function loadOverrides(db: Kysely<Database>, quizId: number): Promise<OverrideRow[]> {
  return db.selectFrom('quiz_mark_overrides')
    .leftJoin('users', 'users.id', 'quiz_mark_overrides.actor_id')
    .select(['quiz_mark_overrides.attempt_id', 'quiz_mark_overrides.criterion', 'quiz_mark_overrides.previous_score', 'quiz_mark_overrides.score', 'quiz_mark_overrides.reason', 'quiz_mark_overrides.created_at', 'users.name as actorName'])
    .where('quiz_mark_overrides.quiz_id', '=', quizId)
    .execute()
}

/** `reach`: the cohorts whose students the caller may see (a tutor's own; see quizReach). */
export async function computeResults(db: Kysely<Database>, quiz: QuizRow, now: Date = new Date(), reach: number[] | 'all' = 'all'): Promise<{ columns: ItemColumn[], rows: StudentResult[] }> {
  const itemRows: QuizItemRow[] = await db.selectFrom('quiz_items').selectAll().where('quiz_id', '=', quiz.id).orderBy('position').execute()
  const interpretationOn = quiz.interpretation === 1
  const [students, sittings, attempts, overrides, drafts, fundusAttempts, fundusOverrides, fundusDrafts] = await Promise.all([
    quizStudents(db, quiz.id, reach),
    db.selectFrom('quiz_sittings').selectAll().where('quiz_id', '=', quiz.id).execute(),
    db.selectFrom('attempts')
      .select(['id', 'learner_id', 'quiz_item_id', 'marks_json', 'interpretation_json', 'slips_json', 'submitted_at'])
      .where('quiz_id', '=', quiz.id).where('kind', '=', 'quiz').orderBy('id').execute(),
    loadOverrides(db, quiz.id),
    db.selectFrom('cases').select(['owner_id', 'quiz_item_id']).where('quiz_id', '=', quiz.id).where('purpose', '=', 'quiz').where('draft_json', 'is not', null).execute(),
    db.selectFrom('fundus_attempts').select(['id', 'learner_id', 'quiz_item_id', 'result_json', 'submitted_at'])
      .where('quiz_id', '=', quiz.id).where('kind', '=', 'quiz').orderBy('id').execute(),
    loadFundusOverrides(db, quiz.id),
    db.selectFrom('quiz_fundus_drafts').select(['student_id as owner_id', 'quiz_item_id']).where('quiz_id', '=', quiz.id).execute(),
  ])
  const sittingOf = new Map<number, QuizSittingRow>(sittings.map(s => [s.student_id, s]))
  const overridesOf = new Map<number, OverrideRow[]>()
  const fundusOverridesOf = new Map<number, OverrideRow[]>()
  for (const o of overrides) overridesOf.set(o.attempt_id, [...(overridesOf.get(o.attempt_id) ?? []), o])
  for (const o of fundusOverrides) fundusOverridesOf.set(o.attempt_id, [...(fundusOverridesOf.get(o.attempt_id) ?? []), o])
  const hasDraft = new Set([...drafts, ...fundusDrafts].map(d => `${d.owner_id}/${d.quiz_item_id}`))

  const columns: ItemColumn[] = itemRows.map((r) => {
    const config = readItemConfig(r)
    return { id: r.id, position: r.position, config, criteria: [], possible: nominalPossible(config, interpretationOn) }
  })
  const seenCriteria = new Map<number, Set<QuizCriterion>>(columns.map(c => [c.id, new Set()]))
  const maxPossible = new Map<number, number>()

  const rows: StudentResult[] = students.map((st) => {
    const sitting = sittingOf.get(st.id)
    const mine = attempts.filter(a => a.learner_id === st.id)
    const mineFundus = fundusAttempts.filter(a => a.learner_id === st.id)
    const items: Record<number, ItemCell> = {}
    let earned = 0
    let slips = 0
    let lastSubmit: string | null = null
    for (const col of columns) {
      // a fundus item's attempts are fundus_attempts rows (their ids are their own)
      const onItem = col.config.kind === 'fundus'
        ? mineFundus.filter(a => a.quiz_item_id === col.id)
        : mine.filter(a => a.quiz_item_id === col.id)
      const counted = onItem.at(-1)
      if (!counted) {
        items[col.id] = { attemptId: null, attempts: 0, submittedAt: null, earned: null, possible: null, marks: [], slips: [], cap: null, overridden: false, draftOnly: hasDraft.has(`${st.id}/${col.id}`) }
        continue
      }
      const marks = col.config.kind === 'fundus' && 'result_json' in counted
        ? applyOverrides(fundusMarksOf(JSON.parse(counted.result_json) as FundusGradeResult, col.config.weights), fundusOverridesOf.get(counted.id) ?? [])
        : effectiveMarks(counted as typeof attempts[number], col.config, interpretationOn, overridesOf.get(counted.id) ?? [])
      // slips are the double Maddox rod record's; a fundus item has marks, not record slips
      const slipCodes = 'slips_json' in counted ? (JSON.parse(counted.slips_json) as { code: string }[]).map(s => s.code) : []
      const pts = cappedPoints(marks, slipCodes.map(code => ({ code })))
      for (const m of marks) if (m.weight > 0) seenCriteria.get(col.id)!.add(m.criterion)
      maxPossible.set(col.id, Math.max(maxPossible.get(col.id) ?? 0, pts.possible))
      items[col.id] = {
        attemptId: counted.id,
        attempts: onItem.length,
        submittedAt: counted.submitted_at,
        earned: pts.earned,
        possible: pts.possible,
        marks,
        slips: slipCodes,
        cap: pts.cap,
        overridden: marks.some(m => m.override),
        draftOnly: false,
      }
      earned += pts.earned
      slips += slipCodes.length
      if (!lastSubmit || counted.submitted_at > lastSubmit) lastSubmit = counted.submitted_at
    }
    const end = sitting ? sittingEnd(sitting, now) ?? lastSubmit : null
    return {
      studentId: st.id,
      name: st.name,
      email: st.email,
      cohortId: st.cohortId,
      cohortName: st.cohortName,
      status: sittingStatus(sitting, now),
      startedAt: sitting?.started_at ?? null,
      finishedAt: sitting ? sittingEnd(sitting, now) : null,
      timeTakenMs: sitting && end ? Math.max(0, Date.parse(end) - Date.parse(sitting.started_at)) : null,
      items,
      earned,
      possible: 0,
      score: 0,
      slips,
    }
  })

  for (const col of columns) {
    const seen = seenCriteria.get(col.id)!
    col.criteria = seen.size
      ? QUIZ_CRITERIA.filter(c => seen.has(c))
      : criteriaOfKind(col.config.kind).filter(c => col.config.weights[c]! > 0 && !(c === 'action' || c === 'reason') && (c !== 'interpretation' || interpretationOn))
    col.possible = maxPossible.get(col.id) ?? col.possible
  }
  for (const r of rows) {
    // an unsubmitted item still counts: it is worth what the item offers, earned 0
    r.possible = columns.reduce((a, c) => a + (r.items[c.id]?.possible ?? c.possible), 0)
    r.score = r.possible ? r.earned / r.possible : 0
  }
  return { columns, rows }
}
