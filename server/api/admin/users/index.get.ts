// GET /api/admin/users (admin): `?q&role&cohortId&sort&dir&page&pageSize` → `{ items,
// total, page, pageSize }`
import { userListQuery } from '#shared/schemas/admin'
import { countRows, onePage } from '~~/server/lib/data/paging'
import type { AdminUserPage } from '#shared/types/admin'

export default defineEventHandler(async (event): Promise<AdminUserPage> => {
  await requireRole(event, 'admin')
  const query = queryAs(event, userListQuery)
  const db = await useDb()

  let base = db.selectFrom('users')
  if (query.q) {
    const like = `%${query.q.toLowerCase().replace(/[\\%_]/g, c => `\\${c}`)}%`
    base = base.where(eb => eb.or([
      eb(eb.fn('lower', ['users.name']), 'like', eb.val(like)),
      eb('users.email', 'like', like),
    ]))
  }
  if (query.role) base = base.where('users.role', '=', query.role)
  if (query.cohortId) {
    base = base.where('users.id', 'in', eb => eb.selectFrom('cohort_members').select('user_id').where('cohort_id', '=', query.cohortId!))
  }

  const total = await countRows(base)
  const rows = await onePage(base
    .select(['users.id', 'users.email', 'users.name', 'users.role', 'users.disabled', 'users.created_at as createdAt', 'users.last_login_at as lastLoginAt'])
    .orderBy(`users.${query.sort}`, query.dir)
    .orderBy('users.id', 'asc'), query)
    .execute()

  const ids = rows.map(r => r.id)
  const memberships = ids.length
    ? await db.selectFrom('cohort_members').innerJoin('cohorts', 'cohorts.id', 'cohort_members.cohort_id')
        .select(['cohort_members.user_id', 'cohorts.id', 'cohorts.name']).where('cohort_members.user_id', 'in', ids).execute()
    : []

  return {
    items: rows.map(r => ({ ...r, disabled: r.disabled === 1, cohorts: memberships.filter(m => m.user_id === r.id).map(m => ({ id: m.id, name: m.name })) })),
    total,
    page: query.page,
    pageSize: query.pageSize,
  }
})
