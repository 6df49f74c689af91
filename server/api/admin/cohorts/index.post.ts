// POST /api/admin/cohorts (admin): create a cohort `{ name }` (409 naming `name` when
// another cohort has it).
import { cohortBody } from '#shared/schemas/admin'
import { assertCohortNameFree } from '~~/server/lib/roster/cohorts'
import type { CohortName } from '#shared/types/admin'

export default defineEventHandler(async (event): Promise<CohortName> => {
  const admin = await requireRole(event, 'admin')
  const { name } = await readBodyAs(event, cohortBody)
  const db = await useDb()
  await assertCohortNameFree(name)
  const now = nowIso()
  const cohort = await db.transaction().execute(async (trx) => {
    const row = await trx.insertInto('cohorts').values({ name, created_at: now, updated_at: now }).returning(['id', 'name']).executeTakeFirstOrThrow()
    await writeAudit(trx, { actorId: admin.id, action: 'cohort.created', targetType: 'cohort', targetId: row.id, detail: { name } })
    return row
  })
  setResponseStatus(event, 201)
  return cohort
})
