// Drill-down: the attempts behind a number on the review page. The same filters
// as the aggregate, plus what the number counted (a slip code, a cell of the
// direction table, an amount band, a learner).
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'
import type { SlipCode } from '#shared/engine/slips'
import type { Eye } from '#shared/engine/types'
import { AMOUNT_BAND_EDGES } from '#shared/review/bands'
import type { ReviewAttemptsQuery } from '#shared/schemas/review'
import type { ReviewAttemptRow, ReviewAttemptsResponse } from '#shared/types/review'
import { bandCondition } from './aggregates'
import { applyReviewFilters } from './filters'
import type { ReviewScope } from './scope'

export function drillQuery(db: Kysely<Database>, q: ReviewAttemptsQuery, scope: ReviewScope) {
  let base = applyReviewFilters(db.selectFrom('attempts'), 'attempts', q, scope)
  if (q.learnerId) base = base.where('attempts.learner_id', '=', q.learnerId)
  if (q.code) {
    const code = q.code
    base = base.where('attempts.id', 'in', (eb) => {
      let s = eb.selectFrom('attempt_slips').select('attempt_slips.attempt_id').where('attempt_slips.code', '=', code)
      if (q.eye) s = s.where('attempt_slips.eye', '=', q.eye)
      if (q.learnerId) s = s.where('attempt_slips.learner_id', '=', q.learnerId)
      return s
    })
  }
  const eye = q.eye?.toLowerCase() as 're' | 'le' | undefined
  if (eye && q.trueDirection) base = base.where(`attempts.${eye}_true_direction`, '=', q.trueDirection)
  if (eye && q.recordedDirection) {
    base = q.recordedDirection === 'missing'
      ? base.where(`attempts.${eye}_recorded_direction`, 'is', null)
      : base.where(`attempts.${eye}_recorded_direction`, '=', q.recordedDirection)
  }
  if (q.eye && q.amountBand) {
    const edge = AMOUNT_BAND_EDGES.find(b => b.band === q.amountBand)!
    base = base.where(bandCondition(q.eye, edge) as never)
  }
  return base
}

export async function drillAttempts(db: Kysely<Database>, q: ReviewAttemptsQuery, scope: ReviewScope, all = false): Promise<ReviewAttemptsResponse> {
  const base = drillQuery(db, q, scope)
  const { total } = await base.select(eb => eb.fn.countAll<number>().as('total')).executeTakeFirstOrThrow()
  let page = base
    .innerJoin('users', 'users.id', 'attempts.learner_id')
    .leftJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
    .select([
      'attempts.id', 'attempts.learner_id', 'users.name as learner_name', 'cohorts.name as cohort_name', 'attempts.kind',
      'attempts.quiz_id', 'attempts.template_id', 'attempts.condition', 'attempts.submitted_at', 'attempts.score', 'attempts.record_text',
    ])
    .orderBy('attempts.submitted_at', 'desc').orderBy('attempts.id', 'desc')
  if (!all) page = page.limit(q.pageSize).offset((q.page - 1) * q.pageSize)
  else page = page.limit(20_000)
  const rows = await page.execute()
  const ids = rows.map(r => r.id)
  const slips = ids.length
    ? await db.selectFrom('attempt_slips').select(['attempt_id', 'code', 'eye']).where('attempt_id', 'in', ids).orderBy('id').execute()
    : []
  const items: ReviewAttemptRow[] = rows.map(r => ({
    id: r.id,
    learner: { id: r.learner_id, name: r.learner_name },
    cohort: r.cohort_name ?? null,
    kind: r.kind,
    quizId: r.quiz_id,
    templateId: r.template_id,
    condition: r.condition,
    submittedAt: r.submitted_at,
    score: r.score,
    record: r.record_text,
    slips: slips.filter(s => s.attempt_id === r.id).map(s => ({ code: s.code as SlipCode, ...(s.eye ? { eye: s.eye as Eye } : {}) })),
  }))
  return { items, total: Number(total), page: q.page, pageSize: q.pageSize }
}
