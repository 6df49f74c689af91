// A fundus item's marks: the fundus grading (server/lib/fundus/grade.ts) gives
// each measured eye an angle mark and a finding mark (0, ½ or 1); the item has two
// criteria, each the mean over its eyes, weighted by the tutor. Overrides on fundus
// attempts live in their own table (quiz_fundus_overrides) with the same shape.
import type { Kysely } from 'kysely'
import type { FundusGradeResult } from '#shared/engine/fundus/result'
import type { QuizCriterion } from '#shared/schemas/quiz'
import type { EffectiveMark } from '#shared/types/quiz'
import type { Database } from '~~/db/schema'
import type { OverrideRow } from './overrides'

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

export async function loadFundusOverrides(db: Kysely<Database>, quizId: number): Promise<OverrideRow[]> {
  return db.selectFrom('quiz_fundus_overrides as o')
    .leftJoin('users', 'users.id', 'o.actor_id')
    .select(['o.fundus_attempt_id as attempt_id', 'o.criterion', 'o.previous_score', 'o.score', 'o.reason', 'o.created_at', 'users.name as actorName'])
    .where('o.quiz_id', '=', quizId)
    .execute()
}
