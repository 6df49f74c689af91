// PATCH /api/casebook/cases/:id (tutor, lecturer): change an exact case, or `{ archived
// }`.
import { idParam } from '#shared/schemas/common'
import { CASEBOOK_ROLES } from '#shared/auth/roles'
import { casebookCasePatch } from '#shared/schemas/casebook'
import { casebookCaseFor, caseOut } from '~~/server/lib/casebook/casebook'
import { caseFromSpec } from '~~/server/lib/engine/generator'
import type { CasebookCaseView } from '#shared/types/casebook'

export default defineEventHandler(async (event): Promise<CasebookCaseView> => {
  const user = await requireRole(event, ...CASEBOOK_ROLES)
  const { id } = paramsAs(event, idParam)
  const body = await readBodyAs(event, casebookCasePatch)
  const db = await useDb()
  const row = await casebookCaseFor(db, user, id)
  if (!row) notFound('That case')
  if (body.spec) {
    const built = caseFromSpec(body.spec)
    if (!built.ok) badRequest(built.issues.map(i => ({ path: `spec.${i.path}`, message: i.message })))
  }
  const now = nowIso()
  const updated = await db.updateTable('casebook_cases').set({
    ...(body.title !== undefined ? { title: body.title } : {}),
    ...(body.spec !== undefined ? { spec_json: JSON.stringify(body.spec) } : {}),
    ...(body.tolerance !== undefined ? { tolerance: body.tolerance } : {}),
    ...(body.archived !== undefined ? { archived_at: body.archived ? now : null } : {}),
    updated_at: now,
  }).where('id', '=', id).returningAll().executeTakeFirstOrThrow()
  return caseOut(updated)
})
