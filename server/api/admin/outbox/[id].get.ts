// GET /api/admin/outbox/:id (admin): one caught message.
import { idParam } from '#shared/schemas/common'
import type { OutboxMessage } from '#shared/types/admin'

export default defineEventHandler(async (event): Promise<OutboxMessage> => {
  await requireRole(event, 'admin')
  const { id } = paramsAs(event, idParam)
  const db = await useDb()
  const message = await db.selectFrom('outbox')
    .select(['id', 'message_id as messageId', 'from_address as from', 'to_address as to', 'subject', 'text_body as text', 'received_at as receivedAt'])
    .where('id', '=', id).executeTakeFirst()
  if (!message) notFound('That message')
  return message
})
