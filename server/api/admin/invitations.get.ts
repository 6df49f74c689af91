// GET /api/admin/invitations (admin): the invitations sent, paged.
import { pageQuery } from '#shared/schemas/common'
import { countRows, onePage } from '~~/server/lib/data/paging'
import type { AdminInvitationPage } from '#shared/types/admin'

export default defineEventHandler(async (event): Promise<AdminInvitationPage> => {
  await requireRole(event, 'admin')
  const { page, pageSize } = queryAs(event, pageQuery)
  const db = await useDb()
  const base = db.selectFrom('invitations')
  const total = await countRows(base)
  const rows = await onePage(base.leftJoin('cohorts', 'cohorts.id', 'invitations.cohort_id')
    .select(['invitations.id', 'invitations.email', 'invitations.role', 'invitations.expires_at', 'invitations.used_at', 'invitations.created_at', 'cohorts.name as cohortName'])
    .orderBy('invitations.id', 'desc'), { page, pageSize }).execute()
  const now = Date.now()
  return {
    items: rows.map(r => ({
      id: r.id,
      email: r.email,
      role: r.role,
      cohortName: r.cohortName,
      createdAt: r.created_at,
      expiresAt: r.expires_at,
      state: r.used_at ? 'accepted' : Date.parse(r.expires_at) <= now ? 'expired' : 'pending',
    })),
    total,
    page,
    pageSize,
  }
})
