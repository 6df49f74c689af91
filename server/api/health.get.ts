// Liveness and readiness: answers once the database is open and migrated.
import type { OkReply } from '#shared/types/common'

export default defineEventHandler(async (): Promise<OkReply> => {
  const db = await useDb()
  await db.selectFrom('users').select('id').limit(1).execute()
  return { ok: true }
})
