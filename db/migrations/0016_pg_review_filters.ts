// PostgreSQL only: indexes that lead with a selective review filter (case template,
// condition), for the slip-pattern views filtered by one of them across all cohorts.
// Frozen in time: imports no app code.
//
// Why only PostgreSQL: 0004's review indexes lead with cohort_id and carry the filter
// columns last, so SQLite answers a filtered view from the index alone; PostgreSQL uses
// them too, but with every cohort in scope it walks all of the index and drops what
// the filter rejects (a template is about a twelfth of the attempts), which cost it
// 80–105 ms for one query at 200,000 attempts (npm run perf:review, docs/performance.md).
// Leading with the filter, it reads only the matching entries (20 ms in the same
// conditions). SQLite's planner is left as 0004, 0007 and 0012 tuned it: on SQLite this
// migration does nothing. Each index carries the columns its query groups by and the
// other filters, so PostgreSQL answers with an index-only scan.
import type { Kysely } from 'kysely'
import { PostgresAdapter } from 'kysely'

const onPostgres = (db: Kysely<any>): boolean => db.getExecutor().adapter instanceof PostgresAdapter

const ATTEMPT_GROUPS = ['cohort_id', 're_true_direction', 're_recorded_direction', 'le_true_direction', 'le_recorded_direction']
const SLIP_GROUPS = ['cohort_id', 'code', 'eye']

const INDEXES: { name: string, table: 'attempts' | 'attempt_slips', columns: string[] }[] = [
  { name: 'attempts_pg_template', table: 'attempts', columns: ['template_id', ...ATTEMPT_GROUPS, 'kind', 'quiz_id', 'submitted_at', 'condition'] },
  { name: 'attempts_pg_condition', table: 'attempts', columns: ['condition', ...ATTEMPT_GROUPS, 'kind', 'quiz_id', 'submitted_at', 'template_id'] },
  { name: 'attempt_slips_pg_template', table: 'attempt_slips', columns: ['template_id', ...SLIP_GROUPS, 'kind', 'quiz_id', 'created_at', 'condition'] },
  { name: 'attempt_slips_pg_condition', table: 'attempt_slips', columns: ['condition', ...SLIP_GROUPS, 'kind', 'quiz_id', 'created_at', 'template_id'] },
]

export async function up(db: Kysely<any>): Promise<void> {
  if (!onPostgres(db)) return
  for (const i of INDEXES) await db.schema.createIndex(i.name).on(i.table).columns(i.columns).execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  if (!onPostgres(db)) return
  for (const i of INDEXES) await db.schema.dropIndex(i.name).execute()
}
