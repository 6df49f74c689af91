// GET /api/admin/cohorts (admin): the cohorts with member counts.
import type { AdminCohortList } from '#shared/types/admin'

export default defineEventHandler(async (event): Promise<AdminCohortList> => {
  await requireRole(event, 'admin')
  const db = await useDb()
  const rows = await db.selectFrom('cohorts')
    .leftJoin('cohort_members', 'cohort_members.cohort_id', 'cohorts.id')
    .leftJoin('users', 'users.id', 'cohort_members.user_id')
    .select(eb => [
      'cohorts.id',
      'cohorts.name',
      'cohorts.created_at',
      eb.fn.sum<number>(eb.case().when('users.role', '=', 'student').then(1).else(0).end()).as('students'),
      eb.fn.sum<number>(eb.case().when('users.role', 'in', ['tutor', 'lecturer']).then(1).else(0).end()).as('staff'),
    ])
    .groupBy(['cohorts.id', 'cohorts.name', 'cohorts.created_at'])
    .orderBy('cohorts.name')
    .execute()
  return { items: rows.map(r => ({ id: r.id, name: r.name, createdAt: r.created_at, students: Number(r.students ?? 0), staff: Number(r.staff ?? 0) })) }
})
