// PATCH /api/admin/cohorts/:id (admin): rename a cohort `{ name }` (409 naming `name`
// when another cohort has it).
import { idParam } from '#shared/schemas/common'
import { cohortBody } from '#shared/schemas/admin'
import { assertCohortNameFree } from '~~/server/lib/roster/cohorts'
import type { CohortName } from '#shared/types/admin'

export default defineEventHandler(async (event): Promise<CohortName> => {
  const admin = await requireRole(event, 'admin')
  const { id } = paramsAs(event, idParam)
  const { name } = await readBodyAs(event, cohortBody)
  const db = await useDb()
  const cohort = await db.selectFrom('cohorts').select(['id', 'name']).where('id', '=', id).executeTakeFirst()
  if (!cohort) notFound('That cohort')
  if (cohort.name === name) return cohort
  await assertCohortNameFree(name, id)
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('cohorts').set({ name, updated_at: nowIso() }).where('id', '=', id).execute()
    await writeAudit(trx, { actorId: admin.id, action: 'cohort.renamed', targetType: 'cohort', targetId: id, detail: { from: cohort.name, to: name } })
  })
  return { id, name }
})
