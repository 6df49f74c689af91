// POST /api/casebook/cases (tutor, lecturer): `{ title, spec /* caseSpecSchema */,
// tolerance? }`; impossible entries are 400 with paths such as
// `spec.gazes.primary.torsion.RE`.
import { CASEBOOK_ROLES } from '#shared/auth/roles'
import { casebookCaseBody } from '#shared/schemas/casebook'
import { caseOut } from '~~/server/lib/casebook/casebook'
import { caseFromSpec } from '~~/server/lib/engine/generator'
import type { CasebookCaseView } from '#shared/types/casebook'

export default defineEventHandler(async (event): Promise<CasebookCaseView> => {
  const user = await requireRole(event, ...CASEBOOK_ROLES)
  const body = await readBodyAs(event, casebookCaseBody)
  // the schema already refused impossible entries; the engine builds it to be sure
  const built = caseFromSpec(body.spec)
  if (!built.ok) badRequest(built.issues.map(i => ({ path: `spec.${i.path}`, message: i.message })))
  const db = await useDb()
  const now = nowIso()
  const row = await db.insertInto('casebook_cases').values({
    owner_id: user.id,
    title: body.title,
    spec_json: JSON.stringify(body.spec),
    tolerance: body.tolerance,
    archived_at: null,
    created_at: now,
    updated_at: now,
  }).returningAll().executeTakeFirstOrThrow()
  setResponseStatus(event, 201)
  return caseOut({ ...row, ownerName: user.name })
})
