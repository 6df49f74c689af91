// Autosave the bench (dials, prisms, lights, record pad) so a reload resumes it.
import { PRACTICE_ROLES } from '#shared/auth/roles'
import { benchDraftSchema, caseIdParams } from '#shared/schemas/practice'
import type { DraftSaved } from '#shared/types/common'

export default defineEventHandler(async (event): Promise<DraftSaved> => {
  const user = await requireRole(event, ...PRACTICE_ROLES)
  const { id } = paramsAs(event, caseIdParams)
  const draft = await readBodyAs(event, benchDraftSchema)
  const db = await useDb()
  const savedAt = nowIso()
  const done = await db.updateTable('cases')
    .set({ draft_json: JSON.stringify({ ...draft, savedAt }), updated_at: savedAt })
    .where('id', '=', id).where('owner_id', '=', user.id).where('purpose', '=', 'practice')
    .executeTakeFirst()
  if (!done.numUpdatedRows) notFound('That practice case')
  return { savedAt }
})
