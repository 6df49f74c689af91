// Server-side sessions: the sealed cookie carries a random session id, and this
// table says whether that session still stands (sign-out, a password change, a
// disabled account or a role change revoke it; idle and absolute lifetimes end
// it). Reset requests also record the address that asked, so reset e-mails can
// be limited per address and per account.
import type { Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.createTable('sessions')
    .addColumn('id', 'varchar(64)', c => c.primaryKey())
    .addColumn('user_id', 'integer', c => c.notNull().references('users.id').onDelete('cascade'))
    .addColumn('created_at', 'varchar(32)', c => c.notNull())
    .addColumn('last_seen_at', 'varchar(32)', c => c.notNull())
    .addColumn('expires_at', 'varchar(32)', c => c.notNull())
    .addColumn('revoked_at', 'varchar(32)')
    .execute()
  await db.schema.createIndex('sessions_user').on('sessions').columns(['user_id', 'revoked_at']).execute()
  await db.schema.alterTable('password_resets').addColumn('requested_ip', 'varchar(64)').execute()
  await db.schema.createIndex('password_resets_ip').on('password_resets').columns(['requested_ip', 'created_at']).execute()
  await db.schema.createIndex('password_resets_user_created').on('password_resets').columns(['user_id', 'created_at']).execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('password_resets_user_created').execute()
  await db.schema.dropIndex('password_resets_ip').execute()
  await db.schema.alterTable('password_resets').dropColumn('requested_ip').execute()
  await db.schema.dropTable('sessions').execute()
}
