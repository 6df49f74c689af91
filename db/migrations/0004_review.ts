// Slip patterns: practice sets a tutor or lecturer sends to learners, and the
// covering indexes the review aggregates need. Frozen in time: imports no app code.
//
// Why these indexes: the review page groups 100,000s of attempts and slips by
// code, direction, amount, day and learner under filters on cohort, kind, quiz,
// date and template/condition. Each index carries every column its query reads,
// so SQLite answers from the index alone ("USING COVERING INDEX") and never
// touches the wide attempt rows (JSON of readings, marks, truth), and is ordered
// so the GROUP BY needs no sort. DEVELOPERS.md lists which query uses which.
import { type Kysely, sql } from 'kysely'
import { idType } from './portable'

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.createTable('practice_sets')
    .addColumn('id', idType(db), c => c.primaryKey())
    .addColumn('created_by', 'integer', c => c.references('users.id').onDelete('set null'))
    .addColumn('cohort_id', 'integer', c => c.references('cohorts.id').onDelete('set null'))
    .addColumn('scope', 'varchar(16)', c => c.notNull())
    .addColumn('focus', 'varchar(40)', c => c.notNull())
    .addColumn('eye', 'varchar(2)')
    .addColumn('title', 'varchar(160)', c => c.notNull())
    .addColumn('note', 'text')
    .addColumn('size', 'integer', c => c.notNull())
    .addColumn('mode', 'varchar(16)', c => c.notNull())
    .addColumn('created_at', 'varchar(32)', c => c.notNull())
    .execute()
  await db.schema.createIndex('practice_sets_cohort').on('practice_sets').columns(['cohort_id', 'created_at']).execute()

  await db.schema.createTable('practice_set_learners')
    .addColumn('set_id', 'integer', c => c.notNull().references('practice_sets.id').onDelete('cascade'))
    .addColumn('learner_id', 'integer', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('sent_at', 'varchar(32)', c => c.notNull())
    .addColumn('mail_job_id', 'integer')
    .addPrimaryKeyConstraint('practice_set_learners_pk', ['set_id', 'learner_id'])
    .execute()
  await db.schema.createIndex('practice_set_learners_learner').on('practice_set_learners').columns(['learner_id', 'set_id']).execute()
  await db.schema.createIndex('cases_practice_set').on('cases').columns(['practice_set_id', 'owner_id']).execute()

  // 0002's (cohort, time) indexes are not covering: with a date filter SQLite would
  // prefer them and then read every wide attempt row. The indexes below serve
  // cohort-and-time lookups too (attempts_rv_day, attempt_slips_rv_day).
  await db.schema.dropIndex('attempts_cohort').execute()
  await db.schema.dropIndex('attempt_slips_cohort').execute()

  // Each review index leads with cohort_id (the scope: one cohort, a tutor's few, or all),
  // then the columns a query GROUPs BY, so SQLite groups while it walks the index
  // instead of sorting; then the filter columns, so the index alone answers.
  const attemptFilters = ['kind', 'quiz_id', 'submitted_at', 'template_id', 'condition']
  const onAttempts = async (name: string, lead: string[]) =>
    db.schema.createIndex(name).on('attempts').columns(['cohort_id', ...lead, ...attemptFilters]).execute()
  await onAttempts('attempts_rv_learner', ['learner_id'])
  await onAttempts('attempts_rv_direction', ['re_true_direction', 're_recorded_direction', 'le_true_direction', 'le_recorded_direction'])
  await onAttempts('attempts_rv_re_amount', ['re_amount_error'])
  await onAttempts('attempts_rv_le_amount', ['le_amount_error'])
  // newest-first lists across every cohort stop after one page
  await db.schema.createIndex('attempts_rv_time').on('attempts').columns(['submitted_at', 'cohort_id', 'kind', 'quiz_id', 'template_id', 'condition', 'learner_id']).execute()
  // grouping by day needs the day itself in the index (an index on an expression)
  await sql`create index attempts_rv_day on attempts (cohort_id, substr(submitted_at, 1, 10), kind, quiz_id, submitted_at, template_id, condition)`.execute(db)

  const slipFilters = ['kind', 'quiz_id', 'created_at', 'template_id', 'condition']
  const onSlips = async (name: string, lead: string[]) =>
    db.schema.createIndex(name).on('attempt_slips').columns(['cohort_id', ...lead, ...slipFilters]).execute()
  await onSlips('attempt_slips_rv_code', ['code', 'eye'])
  await onSlips('attempt_slips_rv_learner', ['learner_id', 'code', 'attempt_id', 'eye'])
  await sql`create index attempt_slips_rv_day on attempt_slips (cohort_id, substr(created_at, 1, 10), code, eye, kind, quiz_id, created_at, template_id, condition)`.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const name of ['attempt_slips_rv_day', 'attempt_slips_rv_learner', 'attempt_slips_rv_code', 'attempts_rv_day', 'attempts_rv_time',
    'attempts_rv_le_amount', 'attempts_rv_re_amount', 'attempts_rv_direction', 'attempts_rv_learner', 'cases_practice_set']) {
    await db.schema.dropIndex(name).execute()
  }
  await db.schema.createIndex('attempts_cohort').on('attempts').columns(['cohort_id', 'submitted_at']).execute()
  await db.schema.createIndex('attempt_slips_cohort').on('attempt_slips').columns(['cohort_id', 'created_at', 'code']).execute()
  await db.schema.dropTable('practice_set_learners').execute()
  await db.schema.dropTable('practice_sets').execute()
}
