import type { Kysely, Transaction } from 'kysely'
import type { Database } from '~~/db/schema'

export interface AuditInput {
  actorId: number | null
  action: string
  targetType?: string
  targetId?: string | number
  detail?: Record<string, unknown>
}

/** Writes one audit-log row; call it inside the same transaction as the change. */
export async function writeAudit(db: Kysely<Database> | Transaction<Database>, entry: AuditInput): Promise<void> {
  await db.insertInto('audit_log').values({
    actor_id: entry.actorId,
    action: entry.action,
    target_type: entry.targetType ?? null,
    target_id: entry.targetId === undefined ? null : String(entry.targetId),
    detail: entry.detail ? JSON.stringify(entry.detail) : null,
    created_at: nowIso(),
  }).execute()
}
