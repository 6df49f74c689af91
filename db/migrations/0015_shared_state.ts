// Several instances behind one load balancer share everything through the
// database (issue 15): a sign-in attempt being checked is a row (pending = 1)
// rather than a count in one process's memory, and a mail job being sent is held
// by one instance at a time with a lease, so no two instances send it twice.
// Frozen in time: imports no app code.
import type { Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('login_failures').addColumn('pending', 'integer', c => c.notNull().defaultTo(0)).execute()
  await db.schema.alterTable('mail_jobs').addColumn('lease_until', 'varchar(32)').execute()
  await db.schema.alterTable('mail_jobs').addColumn('lease_owner', 'varchar(64)').execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('mail_jobs').dropColumn('lease_owner').execute()
  await db.schema.alterTable('mail_jobs').dropColumn('lease_until').execute()
  await db.schema.alterTable('login_failures').dropColumn('pending').execute()
}
