// Fundus items in quizzes: a student's autosaved marks on a fundus item (a
// photograph item has no case row to hold them), a tutor's changes to the marks of
// a fundus attempt (quiz_mark_overrides points at `attempts`, the double Maddox rod
// table, so fundus attempts need their own), and an index for results by quiz.
import type { Kysely } from 'kysely'
import { idType, realType } from './portable'

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.createTable('quiz_fundus_drafts')
    .addColumn('quiz_item_id', 'integer', c => c.notNull().references('quiz_items.id').onDelete('cascade'))
    .addColumn('student_id', 'integer', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('quiz_id', 'integer', c => c.notNull())
    .addColumn('draft_json', 'text', c => c.notNull())
    .addColumn('saved_at', 'varchar(32)', c => c.notNull())
    .addPrimaryKeyConstraint('quiz_fundus_drafts_pk', ['quiz_item_id', 'student_id'])
    .execute()
  await db.schema.createIndex('quiz_fundus_drafts_quiz').on('quiz_fundus_drafts').column('quiz_id').execute()

  await db.schema.createTable('quiz_fundus_overrides')
    .addColumn('id', idType(db), c => c.primaryKey())
    .addColumn('fundus_attempt_id', 'integer', c => c.notNull().references('fundus_attempts.id').onDelete('cascade'))
    .addColumn('quiz_id', 'integer', c => c.notNull())
    .addColumn('criterion', 'varchar(32)', c => c.notNull())
    .addColumn('previous_score', realType(db), c => c.notNull())
    .addColumn('score', realType(db), c => c.notNull())
    .addColumn('reason', 'text', c => c.notNull())
    .addColumn('actor_id', 'integer')
    .addColumn('created_at', 'varchar(32)', c => c.notNull())
    .execute()
  await db.schema.createIndex('quiz_fundus_overrides_quiz').on('quiz_fundus_overrides').column('quiz_id').execute()

  await db.schema.createIndex('fundus_attempts_quiz').on('fundus_attempts').columns(['quiz_id', 'quiz_item_id', 'learner_id']).execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('fundus_attempts_quiz').execute()
  await db.schema.dropTable('quiz_fundus_overrides').execute()
  await db.schema.dropTable('quiz_fundus_drafts').execute()
}
