// POST /api/casebook/templates (tutor, lecturer): `{ title, templateId, ranges?,
// tolerance?, notes? }`; ranges must sit inside the published ones and leave the
// generator room (400 naming `ranges.torsion`…).
import { CASEBOOK_ROLES } from '#shared/auth/roles'
import { casebookTemplateBody } from '#shared/schemas/casebook'
import { templateOut } from '~~/server/lib/casebook/casebook'
import { narrowingProblems } from '~~/server/lib/quiz/narrow'
import type { CasebookTemplateView } from '#shared/types/casebook'

export default defineEventHandler(async (event): Promise<CasebookTemplateView> => {
  const user = await requireRole(event, ...CASEBOOK_ROLES)
  const body = await readBodyAs(event, casebookTemplateBody)
  const problems = narrowingProblems(body.templateId, body.ranges)
  if (problems.length) badRequest(problems)
  const db = await useDb()
  const now = nowIso()
  const row = await db.insertInto('casebook_templates').values({
    owner_id: user.id,
    title: body.title,
    template_id: body.templateId,
    ranges_json: JSON.stringify(body.ranges),
    tolerance: body.tolerance,
    notes: body.notes ?? null,
    archived_at: null,
    created_at: now,
    updated_at: now,
  }).returningAll().executeTakeFirstOrThrow()
  setResponseStatus(event, 201)
  return templateOut({ ...row, ownerName: user.name })
})
