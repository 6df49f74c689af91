// Practice extras: the patient's turns of the rods (patient-turns mode), kept so a
// case reloads with every turn it had and an attempt can name the trial it read;
// and the parts of a graded attempt that replay must show exactly as first shown.
import type { Kysely } from 'kysely'
import { idType } from './portable'

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.createTable('case_turns')
    .addColumn('id', idType(db), c => c.primaryKey())
    .addColumn('case_id', 'integer', c => c.notNull().references('cases.id').onDelete('cascade'))
    .addColumn('trial', 'integer', c => c.notNull())
    .addColumn('gaze', 'varchar(16)', c => c.notNull())
    .addColumn('distance', 'varchar(16)', c => c.notNull())
    .addColumn('prisms_json', 'text', c => c.notNull())
    .addColumn('lights', 'varchar(8)', c => c.notNull())
    // the result as first computed (readings + words), so a reload never recomputes it
    .addColumn('result_json', 'text', c => c.notNull())
    .addColumn('created_at', 'varchar(32)', c => c.notNull())
    .execute()
  await db.schema.createIndex('case_turns_case_trial').on('case_turns').columns(['case_id', 'trial']).unique().execute()

  await db.schema.alterTable('attempts').addColumn('read_as', 'text').execute()
  await db.schema.alterTable('attempts').addColumn('model_record', 'text').execute()
  await db.schema.alterTable('attempts').addColumn('explanation_json', 'text').execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('attempts').dropColumn('explanation_json').execute()
  await db.schema.alterTable('attempts').dropColumn('model_record').execute()
  await db.schema.alterTable('attempts').dropColumn('read_as').execute()
  await db.schema.dropTable('case_turns').execute()
}
