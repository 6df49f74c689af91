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

/** Attempts with a slip of this code (and eye, and learner), found from attempt_slips' own copy of the filter columns. */
function slipAttemptIds(db: Kysely<Database>, q: ReviewAttemptsQuery, scope: ReviewScope, code: SlipCode) {
  let s = applyReviewFilters(db.selectFrom('attempt_slips'), 'attempt_slips', q, scope, { eye: true })
    .where('attempt_slips.code', '=', code)
  if (q.learnerId) s = s.where('attempt_slips.learner_id', '=', q.learnerId)
  return s
}

export function drillQuery(db: Kysely<Database>, q: ReviewAttemptsQuery, scope: ReviewScope) {
  let base = q.code
    ? db.selectFrom('attempts').where('attempts.id', 'in', slipAttemptIds(db, q, scope, q.code).select('attempt_slips.attempt_id'))
    : applyReviewFilters(db.selectFrom('attempts'), 'attempts', q, scope)
  if (q.learnerId) base = base.where('attempts.learner_id', '=', q.learnerId)
  const eye = q.eye?.toLowerCase() as 're' | 'le' | undefined
  if (eye && q.trueDirection) base = base.where(`attempts.${eye}_true_direction`, '=', q.trueDirection)
  if (eye && q.recordedDirection) {
    base = q.recordedDirection === 'missing'
      ? base.where(`attempts.${eye}_recorded_direction`, 'is', null)
      : base.where(`attempts.${eye}_recorded_direction`, '=', q.recordedDirection)
  }
  if (q.eye && q.amountBand) {
    const edge = AMOUNT_BAND_EDGES.find(b => b.band === q.amountBand)!
    base = base.where(bandCondition(q.eye, edge))
  }
  return base
}

/** A page of attempt ids, newest first, and how many there are. */
async function pageOfIds(db: Kysely<Database>, q: ReviewAttemptsQuery, scope: ReviewScope, limit: number, offset: number): Promise<{ ids: number[], total: number }> {
  if (q.code && !q.trueDirection && !q.recordedDirection && !q.amountBand) {
    // a slip count's drill-down: count and page straight from the slips
    const s = slipAttemptIds(db, q, scope, q.code)
    const { total } = await s.select(eb => eb.fn.count<number>('attempt_slips.attempt_id').distinct().as('total')).executeTakeFirstOrThrow()
    const rows = await s.select(eb => ['attempt_slips.attempt_id', eb.fn.max('attempt_slips.created_at').as('at')])
      .groupBy('attempt_slips.attempt_id')
      .orderBy('at', 'desc').orderBy('attempt_slips.attempt_id', 'desc').limit(limit).offset(offset).execute()
    return { ids: rows.map(r => r.attempt_id), total: Number(total) }
  }
  const base = drillQuery(db, q, scope)
  const { total } = await base.select(eb => eb.fn.countAll<number>().as('total')).executeTakeFirstOrThrow()
  const rows = await base.select('attempts.id').orderBy('attempts.submitted_at', 'desc').orderBy('attempts.id', 'desc').limit(limit).offset(offset).execute()
  return { ids: rows.map(r => r.id), total: Number(total) }
}

export async function drillAttempts(db: Kysely<Database>, q: ReviewAttemptsQuery, scope: ReviewScope, all = false): Promise<ReviewAttemptsResponse> {
  const { ids, total } = await pageOfIds(db, q, scope, all ? 20_000 : q.pageSize, all ? 0 : (q.page - 1) * q.pageSize)
  const rows = ids.length
    ? await db.selectFrom('attempts')
        .innerJoin('users', 'users.id', 'attempts.learner_id')
        .leftJoin('cohorts', 'cohorts.id', 'attempts.cohort_id')
        .leftJoin('quizzes', 'quizzes.id', 'attempts.quiz_id')
        .select(['quizzes.title as quiz_title',
          'attempts.id', 'attempts.learner_id', 'users.name as learner_name', 'cohorts.name as cohort_name', 'attempts.kind',
          'attempts.quiz_id', 'attempts.template_id', 'attempts.condition', 'attempts.submitted_at', 'attempts.score', 'attempts.record_text',
        ])
        .where('attempts.id', 'in', ids).execute()
    : []
  const byId = new Map(rows.map(r => [r.id, r]))
  const slips = ids.length
    ? await db.selectFrom('attempt_slips').select(['attempt_id', 'code', 'eye']).where('attempt_id', 'in', ids).orderBy('id').execute()
    : []
  const items: ReviewAttemptRow[] = ids.filter(id => byId.has(id)).map((id) => {
    const r = byId.get(id)!
    return {
      id: r.id,
      learner: { id: r.learner_id, name: r.learner_name },
      cohort: r.cohort_name ?? null,
      kind: r.kind,
      quizId: r.quiz_id,
      quizTitle: r.quiz_title ?? null,
      templateId: r.template_id,
      condition: r.condition,
      submittedAt: r.submitted_at,
      score: r.score,
      record: r.record_text,
      slips: slips.filter(s => s.attempt_id === r.id).map(s => ({ code: s.code as SlipCode, ...(s.eye ? { eye: s.eye as Eye } : {}) })),
    }
  })
  return { items, total, page: q.page, pageSize: q.pageSize }
}
