import { pageQuery } from '#shared/schemas/admin'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  const { page, pageSize } = queryAs(event, pageQuery)
  const db = await useDb()
  const { total } = await db.selectFrom('audit_log').select(eb => eb.fn.countAll<number>().as('total')).executeTakeFirstOrThrow()
  const rows = await db.selectFrom('audit_log').leftJoin('users', 'users.id', 'audit_log.actor_id')
    .select(['audit_log.id', 'audit_log.action', 'audit_log.target_type', 'audit_log.target_id', 'audit_log.detail', 'audit_log.created_at', 'users.name as actorName'])
    .orderBy('audit_log.id', 'desc').limit(pageSize).offset((page - 1) * pageSize).execute()
  return {
    items: rows.map(r => ({
      id: r.id,
      action: r.action,
      target: r.target_type ? `${r.target_type} ${r.target_id ?? ''}`.trim() : null,
      detail: r.detail ? JSON.parse(r.detail) as unknown : null,
      actorName: r.actorName ?? 'system',
      createdAt: r.created_at,
    })),
    total: Number(total),
    page,
    pageSize,
  }
})
