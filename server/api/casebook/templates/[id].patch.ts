// PATCH /api/casebook/templates/:id (tutor, lecturer): change a narrowed template, or `{
// archived }`.
import { idParam } from '#shared/schemas/common'
import { CASEBOOK_ROLES } from '#shared/auth/roles'
import { casebookTemplatePatch } from '#shared/schemas/casebook'
import { casebookTemplateFor, templateOut } from '~~/server/lib/casebook/casebook'
import { narrowingProblems } from '~~/server/lib/quiz/narrow'
import type { CasebookTemplateView } from '#shared/types/casebook'

export default defineEventHandler(async (event): Promise<CasebookTemplateView> => {
  const user = await requireRole(event, ...CASEBOOK_ROLES)
  const { id } = paramsAs(event, idParam)
  const body = await readBodyAs(event, casebookTemplatePatch)
  const db = await useDb()
  const row = await casebookTemplateFor(db, user, id)
  if (!row) notFound('That case template')
  if (body.ranges) {
    const problems = narrowingProblems(row.template_id, body.ranges)
    if (problems.length) badRequest(problems)
  }
  const now = nowIso()
  const updated = await db.updateTable('casebook_templates').set({
    ...(body.title !== undefined ? { title: body.title } : {}),
    ...(body.ranges !== undefined ? { ranges_json: JSON.stringify(body.ranges) } : {}),
    ...(body.tolerance !== undefined ? { tolerance: body.tolerance } : {}),
    ...(body.notes !== undefined ? { notes: body.notes } : {}),
    ...(body.archived !== undefined ? { archived_at: body.archived ? now : null } : {}),
    updated_at: now,
  }).where('id', '=', id).returningAll().executeTakeFirstOrThrow()
  return templateOut(updated)
})
