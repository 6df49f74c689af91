// The page's filters as WHERE clauses. attempts and attempt_slips carry the same
// denormalised columns (cohort, kind, quiz, template, condition), so one helper
// serves both; only the time column differs.
import { sql } from 'kysely'
import type { SelectQueryBuilder } from 'kysely'
import type { Database } from '~~/db/schema'
import type { ReviewFilters } from '#shared/schemas/review'
import type { ReviewScope } from './scope'

type Table = 'attempts' | 'attempt_slips'

/** The day after an ISO day, so "to" includes the whole of that day. */
export function dayAfter(day: string): string {
  return new Date(Date.parse(`${day}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10)
}

/** Template ids a filter value names: a base id (`so-palsy-left`) stands for both difficulties. */
export function templateIds(template: string): string[] {
  return /-(standard|challenging)$/.test(template) ? [template] : [template, `${template}-standard`, `${template}-challenging`]
}

export function applyReviewFilters<T extends Table, O>(
  qb: SelectQueryBuilder<Database, T, O>,
  table: T,
  f: Partial<ReviewFilters>,
  scope: ReviewScope,
  options: { eye?: boolean, dateByIndex?: boolean } = {},
): SelectQueryBuilder<Database, T, O> {
  // Kysely cannot type a column reference shared by two tables; the names are checked here instead.
  let q = qb as SelectQueryBuilder<any, any, O>
  const col = (name: string) => `${table}.${name}`
  if (scope.cohortIds) q = q.where(col('cohort_id'), 'in', scope.cohortIds.length ? scope.cohortIds : [-1])
  else q = q.where(col('cohort_id'), 'is not', null)
  if (f.kind) q = q.where(col('kind'), '=', f.kind)
  if (f.quizId) q = q.where(col('quiz_id'), '=', f.quizId)
  const column = col(table === 'attempts' ? 'submitted_at' : 'created_at')
  // dateByIndex false: the same comparison on an expression no index holds, so that for
  // a date range SQLite keeps the query's covering index instead of a time index that
  // would read every wide row in the range (a text || '' is the text itself)
  const time = options.dateByIndex === false ? sql<string>`${sql.ref(column)} || ''` : column
  if (f.from) q = q.where(time, '>=', f.from)
  if (f.to) q = q.where(time, '<', dayAfter(f.to))
  if (f.template) q = q.where(col('template_id'), 'in', templateIds(f.template))
  if (f.condition) q = q.where(col('condition'), '=', f.condition)
  if (options.eye && f.eye && table === 'attempt_slips') q = q.where(col('eye'), '=', f.eye)
  return q as SelectQueryBuilder<Database, T, O>
}
