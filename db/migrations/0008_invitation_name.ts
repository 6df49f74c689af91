// An invitation may carry the invitee's name (a roster row has one), so the
// acceptance form can offer it instead of asking again.
import type { Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('invitations').addColumn('name', 'varchar(120)').execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('invitations').dropColumn('name').execute()
}
