// Slip patterns: practice sets a tutor or lecturer sends to learners, and the
// covering indexes the review aggregates need. Frozen in time: imports no app code.
//
// Why these indexes: the review page groups 100,000s of attempts and slips by
// code, direction, amount band, day and learner under filters on cohort, kind,
// quiz, date and template/condition. Each index below leads with the column a
// filter narrows on and carries every column its query reads, so SQLite answers
// from the index alone ("USING COVERING INDEX") and never touches the wide
// attempt rows (JSON of readings, marks, truth). DEVELOPERS.md lists which
// query uses which.
import type { Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.createTable('practice_sets')
    .addColumn('id', 'integer', c => c.primaryKey())
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

  // attempts: totals, direction table, amount bands, days — by cohort, or across all cohorts
  const attemptCols = ['kind', 'submitted_at', 'learner_id', 'quiz_id', 'template_id', 'condition',
    're_true_direction', 're_recorded_direction', 'le_true_direction', 'le_recorded_direction', 're_amount_error', 'le_amount_error']
  await db.schema.createIndex('attempts_review_cohort').on('attempts').columns(['cohort_id', ...attemptCols]).execute()
  await db.schema.createIndex('attempts_review_time').on('attempts').columns(['submitted_at', 'cohort_id', ...attemptCols.filter(c => c !== 'submitted_at')]).execute()
  // attempt_slips: counts by code, per learner, per day
  const slipCols = ['code', 'eye', 'created_at', 'learner_id', 'attempt_id', 'kind', 'quiz_id', 'template_id', 'condition']
  await db.schema.createIndex('attempt_slips_review_cohort').on('attempt_slips').columns(['cohort_id', ...slipCols]).execute()
  await db.schema.createIndex('attempt_slips_review_code').on('attempt_slips').columns(['code', 'learner_id', 'attempt_id', 'eye', 'cohort_id', 'created_at', 'kind', 'quiz_id', 'template_id', 'condition']).execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  for (const name of ['attempt_slips_review_code', 'attempt_slips_review_cohort', 'attempts_review_time', 'attempts_review_cohort', 'cases_practice_set']) {
    await db.schema.dropIndex(name).execute()
  }
  await db.schema.dropTable('practice_set_learners').execute()
  await db.schema.dropTable('practice_sets').execute()
}
