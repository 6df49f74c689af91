// GET /api/admin/outbox (admin): caught mail and the retry queue, paged.
import { pageQuery } from '#shared/schemas/common'
import { countRows } from '~~/server/lib/data/paging'
import type { OutboxPage } from '#shared/types/admin'

export default defineEventHandler(async (event): Promise<OutboxPage> => {
  await requireRole(event, 'admin')
  const { page, pageSize } = queryAs(event, pageQuery)
  const db = await useDb()
  const total = await countRows(db.selectFrom('outbox'))
  const items = await db.selectFrom('outbox')
    .select(['id', 'from_address as from', 'to_address as to', 'subject', 'received_at as receivedAt'])
    .orderBy('id', 'desc').limit(pageSize).offset((page - 1) * pageSize).execute()
  const queue = await db.selectFrom('mail_jobs')
    .select(['id', 'to_address as to', 'subject', 'status', 'attempts', 'last_error as lastError', 'next_attempt_at as nextAttemptAt'])
    .where('status', '!=', 'sent').orderBy('id', 'desc').limit(50).execute()
  return { items, total, page, pageSize, catcher: mailCatcherEnabled(), queue }
})
