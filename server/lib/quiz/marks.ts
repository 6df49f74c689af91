// The marks of a quiz attempt, for either item kind, as they stand: the grader's
// marks (a double Maddox rod attempt's marks_json, with the interpretation step when
// the quiz asks for it) or a fundus grading's per-eye marks turned into the item's
// two criteria (each the mean over its eyes, weighted by the tutor); then a tutor's
// overrides, the points, and the marks as feedback shows them. Pure functions:
// which kind reads which is server/lib/quiz/item-kinds.ts.
import type { QuizCriterion } from '#shared/schemas/quiz'
import type { FundusGradeResult } from '#shared/engine/fundus/result'
import { cappedPoints } from '#shared/engine/marking'
import type { AttemptRow } from '~~/db/schema'
import type { EffectiveMark } from '#shared/types/quiz'
import type { OverrideRow } from '~~/server/lib/data/mark-overrides'
import type { QuizItemConfig } from './items'

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

const FROM_GRADE = { fundusAngle: 'angle', fundusFinding: 'finding' } as const

export function fundusMarksOf(result: FundusGradeResult, weights: Partial<Record<QuizCriterion, number>>): EffectiveMark[] {
  const eyes = (['RE', 'LE'] as const).filter(e => result.eyes[e])
  return (Object.keys(FROM_GRADE) as (keyof typeof FROM_GRADE)[]).map((criterion) => {
    const per = eyes.flatMap(e => result.eyes[e]!.marks.filter(m => m.criterion === FROM_GRADE[criterion]))
    const score = per.length ? per.reduce((a, m) => a + m.score, 0) / per.length : 0
    return {
      criterion,
      score,
      weight: weights[criterion] ?? 0,
      reason: per.map(m => (eyes.length > 1 ? `${m.eye}: ${m.reason}` : m.reason)).join(' '),
    }
  })
}
