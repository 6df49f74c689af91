// zod schemas for the engine's API bodies. Routes validate with these
// (`readValidatedBody(event, schema.parse)`) and forms reuse them.

import { z } from 'zod'
import { DISTANCES, EYES, GAZES, LIGHTS, MODES, MUSCLES, PRISM_BASES } from './types'
import { MAX_RECORD_LENGTH } from './parser'

const gazeList = GAZES.join(', ')

export const eyeSchema = z.enum(EYES, { error: 'Eye must be "RE" or "LE".' })
export const gazeSchema = z.enum(GAZES, { error: `Position of gaze must be one of: ${gazeList}.` })
export const distanceSchema = z.enum(DISTANCES, { error: 'Fixation distance must be "near" or "distance".' })
export const modeSchema = z.enum(MODES, { error: 'Mode must be "learner-turns" or "patient-turns".' })
export const lightsSchema = z.enum(LIGHTS, { error: 'Lights must be "dim" or "on".' })

/** A rod-axis reading on the ISO 8429 dial. */
export const readingSchema = z
  .number({ error: 'A dial reading must be a number of degrees.' })
  .finite({ error: 'A dial reading must be a finite number.' })
  .min(0, { error: 'A dial reading runs from 0° to 180°.' })
  .max(180, { error: 'A dial reading runs from 0° to 180°.' })

/** Signed torsion in degrees, positive = excyclo. */
export const signedTorsionSchema = z
  .number({ error: 'Torsion must be a number of degrees (positive = excyclo, negative = incyclo).' })
  .finite({ error: 'Torsion must be a finite number.' })
  .min(-45, { error: 'Torsion beyond 45° is not a plausible finding.' })
  .max(45, { error: 'Torsion beyond 45° is not a plausible finding.' })

export const prismSchema = z.object({
  eye: eyeSchema,
  power: z
    .number({ error: 'Prism power must be a number of prism dioptres.' })
    .positive({ error: 'Prism power must be above 0 Δ.' })
    .max(50, { error: 'Prism power above 50 Δ is not on the prism tray.' }),
  base: z.enum(PRISM_BASES, { error: 'Prism base must be up, down, in or out.' }),
})

export const recordTextSchema = z
  .string({ error: 'The record must be text.' })
  .max(MAX_RECORD_LENGTH, { error: `The record is limited to ${MAX_RECORD_LENGTH} characters.` })

export const templateIdSchema = z
  .string({ error: 'The case template must be given by its id.' })
  .regex(/^[a-z0-9-]{1,60}$/, { error: 'A case template id uses lower-case letters, digits and hyphens.' })

export const seedSchema = z
  .string({ error: 'The seed must be text.' })
  .min(1, { error: 'The seed must not be empty.' })
  .max(64, { error: 'The seed is limited to 64 characters.' })

export const practiceCreateSchema = z.object({
  template: templateIdSchema.optional(),
  seed: seedSchema.optional(),
  mode: modeSchema.optional(),
})
export type PracticeCreateBody = z.infer<typeof practiceCreateSchema>

export const sideSchema = z.enum(['right', 'left'], { error: 'Side must be "right" or "left".' })

/** The learner's three-step answer; every part optional so partial answers can be marked. */
export const interpretationSchema = z.object({
  higherEye: eyeSchema.optional(),
  worseGaze: sideSchema.optional(),
  worseTilt: sideSchema.optional(),
  muscle: z
    .union([z.enum(MUSCLES), z.literal('not-applicable')], {
      error: `Muscle must be one of ${MUSCLES.join(', ')} or "not-applicable".`,
    })
    .optional(),
})
export type InterpretationBody = z.infer<typeof interpretationSchema>

export const attemptSubmitSchema = z.object({
  gaze: gazeSchema,
  distance: distanceSchema,
  readings: z.object({ RE: readingSchema, LE: readingSchema }, { error: 'Give both dial readings: { RE, LE }.' }),
  prisms: z.array(prismSchema).max(4, { error: 'At most four prisms fit the trial frame.' }).optional(),
  lights: lightsSchema.optional(),
  record: recordTextSchema,
  interpretation: interpretationSchema.optional(),
})
export type AttemptSubmitBody = z.infer<typeof attemptSubmitSchema>

export const toleranceSchema = z
  .number({ error: 'Tolerance must be a number of degrees.' })
  .min(0.5, { error: 'Tolerance must be at least 0.5°.' })
  .max(10, { error: 'Tolerance must be at most 10°.' })

export const recordCheckSchema = z.object({
  torsion: z.object(
    { RE: signedTorsionSchema, LE: signedTorsionSchema },
    { error: 'Give the known torsion of both eyes: { RE, LE } in signed degrees (positive = excyclo).' },
  ),
  gaze: gazeSchema.optional(),
  distance: distanceSchema.optional(),
  readings: z.object({ RE: readingSchema.optional(), LE: readingSchema.optional() }).optional(),
  record: recordTextSchema,
  tolerance: toleranceSchema.optional(),
})
export type RecordCheckBody = z.infer<typeof recordCheckSchema>
