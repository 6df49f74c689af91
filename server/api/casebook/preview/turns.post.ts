// POST /api/casebook/preview/turns (tutor, lecturer): `{ source, seed, trial, gaze,
// distance, prisms?, lights? }` → the patient's turn on the previewed case (nothing
// stored)
import { CASEBOOK_ROLES } from '#shared/auth/roles'
import { z } from 'zod'
import { caseSourceSchema } from '#shared/schemas/casebook'
import { turnRequestSchema } from '#shared/schemas/practice'
import { seedSchema } from '#shared/engine/schemas'
import { caseFromSnapshot, snapshotSource } from '~~/server/lib/quiz/items'
import { patientSetsRods } from '~~/server/lib/engine/patient'
import type { PatientTurnsResult } from '#shared/engine/presentation'

const previewTurnBody = turnRequestSchema.extend({
  source: caseSourceSchema,
  seed: seedSchema,
  trial: z.number({ error: 'The trial must be a number.' }).int().min(1, { error: 'Trials start at 1.' }).max(1000),
})

// Patient-turns in a casebook preview: the same patient (source + seed) turns the
// rods; nothing is stored, since a preview is not an attempt.
export default defineEventHandler(async (event): Promise<PatientTurnsResult> => {
  const user = await requireRole(event, ...CASEBOOK_ROLES)
  const body = await readBodyAs(event, previewTurnBody)
  const db = await useDb()
  const { snapshot } = await snapshotSource(db, user, body.source)
  const built = caseFromSnapshot(snapshot, body.seed)
  return patientSetsRods(built.case, { gaze: body.gaze, distance: body.distance, prisms: body.prisms ?? [], lights: body.lights ?? 'dim', trial: body.trial })
})
