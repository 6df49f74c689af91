// Patient-turns: the patient turns both rods until each line looks level. The
// server numbers the trials, so the same trial always replays the same setting.
import { PRACTICE_ROLES } from '#shared/auth/roles'
import type { PatientTurnsResult } from '#shared/engine/presentation'
import { caseIdParams, turnRequestSchema } from '#shared/schemas/practice'
import { withCaseErrors } from '~~/server/lib/practice/http'
import { findOwnedCase, recordTurn } from '~~/server/lib/practice/cases'

export default defineEventHandler(async (event): Promise<PatientTurnsResult> => {
  const user = await requireRole(event, ...PRACTICE_ROLES)
  const { id } = paramsAs(event, caseIdParams)
  const setting = await readBodyAs(event, turnRequestSchema)
  const db = await useDb()
  const row = await findOwnedCase(db, id, user.id)
  if (!row) notFound('That practice case')
  return withCaseErrors(() => recordTurn(db, row, setting))
})
