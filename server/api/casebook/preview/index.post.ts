// POST /api/casebook/preview (tutor, lecturer): `{ source: { type: 'engine', templateId
// } \| { type: 'template' \| 'case', id }, seed?, mode? }` → `{ title, seed, mode,
// presentation, truth, tolerance }` (the presentation is exactly what a student gets)
import { CASEBOOK_ROLES } from '#shared/auth/roles'
import { randomBytes } from 'node:crypto'
import { casePreviewBody } from '#shared/schemas/casebook'
import { caseFromSnapshot, snapshotSource } from '~~/server/lib/quiz/items'
import { revealTruth } from '~~/server/lib/engine/attempt'
import { toPresentation } from '~~/server/lib/engine/presentation'
import type { CasePreview } from '#shared/types/casebook'

// A preview shows the presentation exactly as a student receives it, and beside it
// (for the tutor only) the truth the grader will use.
export default defineEventHandler(async (event): Promise<CasePreview> => {
  const user = await requireRole(event, ...CASEBOOK_ROLES)
  const body = await readBodyAs(event, casePreviewBody)
  const db = await useDb()
  const { snapshot, tolerance } = await snapshotSource(db, user, body.source)
  const built = caseFromSnapshot(snapshot, body.seed ?? `preview-${randomBytes(6).toString('hex')}`)
  return {
    title: snapshot.title,
    seed: built.seed,
    mode: body.mode,
    presentation: toPresentation(built.case, body.mode),
    truth: revealTruth(built.case, 'primary', 'near', tolerance),
    tolerance,
  }
})
