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
  // the columns named as the page reads them; `state` from the times
  const rows = await onePage(base.leftJoin('cohorts', 'cohorts.id', 'invitations.cohort_id')
    .select(['invitations.id', 'invitations.email', 'invitations.role', 'cohorts.name as cohortName', 'invitations.created_at as createdAt', 'invitations.expires_at as expiresAt', 'invitations.used_at'])
    .orderBy('invitations.id', 'desc'), { page, pageSize }).execute()
  const now = Date.now()
  return {
    items: rows.map(({ used_at, ...r }) => ({ ...r, state: used_at ? 'accepted' : Date.parse(r.expiresAt) <= now ? 'expired' : 'pending' })),
    total,
    page,
    pageSize,
  }
})
