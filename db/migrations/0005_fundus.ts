// Fundus photographs uploaded by tutors (the file lives under the data folder; the
// row says where, who may see it and where its reference marks are), the cohorts
// each photograph is shared with, and learners' disc–fovea measurements — on a
// generated case's fundus or on an uploaded photograph.
import type { Kysely } from 'kysely'
import { idType, realType } from './portable'

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.createTable('fundus_photos')
    .addColumn('id', idType(db), c => c.primaryKey())
    .addColumn('owner_id', 'integer', c => c.references('users.id').onDelete('set null'))
    .addColumn('title', 'varchar(120)', c => c.notNull())
    .addColumn('eye', 'varchar(2)', c => c.notNull())
    .addColumn('notes', 'text')
    .addColumn('storage_name', 'varchar(80)', c => c.notNull().unique())
    .addColumn('mime', 'varchar(16)', c => c.notNull())
    .addColumn('byte_size', 'integer', c => c.notNull())
    .addColumn('width', 'integer', c => c.notNull())
    .addColumn('height', 'integer', c => c.notNull())
    .addColumn('disc_x', realType(db))
    .addColumn('disc_y', realType(db))
    .addColumn('fovea_x', realType(db))
    .addColumn('fovea_y', realType(db))
    .addColumn('reference_angle', realType(db))
    .addColumn('marked_at', 'varchar(32)')
    .addColumn('created_at', 'varchar(32)', c => c.notNull())
    .addColumn('updated_at', 'varchar(32)', c => c.notNull())
    .execute()
  await db.schema.createIndex('fundus_photos_owner').on('fundus_photos').columns(['owner_id', 'created_at']).execute()

  await db.schema.createTable('fundus_photo_cohorts')
    .addColumn('photo_id', 'integer', c => c.notNull().references('fundus_photos.id').onDelete('cascade'))
    .addColumn('cohort_id', 'integer', c => c.notNull().references('cohorts.id').onDelete('cascade'))
    .addPrimaryKeyConstraint('fundus_photo_cohorts_pk', ['photo_id', 'cohort_id'])
    .execute()
  await db.schema.createIndex('fundus_photo_cohorts_cohort').on('fundus_photo_cohorts').column('cohort_id').execute()

  await db.schema.createTable('fundus_attempts')
    .addColumn('id', idType(db), c => c.primaryKey())
    .addColumn('learner_id', 'integer', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('cohort_id', 'integer')
    .addColumn('kind', 'varchar(16)', c => c.notNull())
    .addColumn('case_id', 'integer', c => c.references('cases.id').onDelete('cascade'))
    .addColumn('photo_id', 'integer', c => c.references('fundus_photos.id').onDelete('cascade'))
    .addColumn('quiz_id', 'integer')
    .addColumn('quiz_item_id', 'integer')
    .addColumn('fundus_version', 'integer')
    .addColumn('marks_json', 'text', c => c.notNull())
    .addColumn('result_json', 'text', c => c.notNull())
    .addColumn('score', realType(db), c => c.notNull())
    .addColumn('re_angle', realType(db))
    .addColumn('le_angle', realType(db))
    .addColumn('submitted_at', 'varchar(32)', c => c.notNull())
    .execute()
  await db.schema.createIndex('fundus_attempts_learner').on('fundus_attempts').columns(['learner_id', 'submitted_at']).execute()
  await db.schema.createIndex('fundus_attempts_case').on('fundus_attempts').column('case_id').execute()
  await db.schema.createIndex('fundus_attempts_photo').on('fundus_attempts').column('photo_id').execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropTable('fundus_attempts').execute()
  await db.schema.dropTable('fundus_photo_cohorts').execute()
  await db.schema.dropTable('fundus_photos').execute()
}
