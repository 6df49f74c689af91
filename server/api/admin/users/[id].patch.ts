// PATCH /api/admin/users/:id (admin): `{ name?, role?, disabled?, cohortIds? }`; a new
// role or disabling ends every session of that person
import { idParam } from '#shared/schemas/common'
import { userPatchBody } from '#shared/schemas/admin'
import { updateUser } from '~~/server/lib/roster/users'
import type { AdminUserChanged } from '#shared/types/admin'

export default defineEventHandler(async (event): Promise<AdminUserChanged> => {
  const admin = await requireRole(event, 'admin')
  const { id } = paramsAs(event, idParam)
  const body = await readBodyAs(event, userPatchBody)
  const db = await useDb()

  const user = await db.selectFrom('users').selectAll().where('id', '=', id).executeTakeFirst()
  if (!user) notFound('That user')
  await updateUser(db, admin, user, body)

  const updated = await db.selectFrom('users').select(['id', 'email', 'name', 'role', 'disabled']).where('id', '=', id).executeTakeFirstOrThrow()
  const cohorts = await db.selectFrom('cohort_members').innerJoin('cohorts', 'cohorts.id', 'cohort_members.cohort_id')
    .select(['cohorts.id', 'cohorts.name']).where('cohort_members.user_id', '=', id).execute()
  return { ...updated, disabled: updated.disabled === 1, cohorts }
})
