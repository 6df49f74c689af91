// zod schemas for the fundus routes and forms (issue 7).
import { z } from 'zod'
import { FUNDUS_FINDINGS } from '../engine/fundus/normals'
import { EYES } from '../engine/types'

const coordinate = (axis: 'x' | 'y') => z
  .number({ error: `The ${axis} position must be a number.` })
  .finite({ error: `The ${axis} position must be a finite number.` })
  .min(-100_000, { error: `The ${axis} position is off the picture.` })
  .max(100_000, { error: `The ${axis} position is off the picture.` })

export const pointSchema = z.object({ x: coordinate('x'), y: coordinate('y') }, { error: 'A mark needs x and y.' })

export const fundusFindingSchema = z.enum(FUNDUS_FINDINGS, { error: 'Record excyclo, incyclo or within-normal.' })

export const fundusEyeMarksSchema = z.object({
  disc: pointSchema,
  fovea: pointSchema,
  finding: fundusFindingSchema,
}, { error: 'Mark the disc centre and the fovea and record a finding.' })

/** A learner's measurement of both eyes of a generated case (picture units: disc diameters). */
export const caseFundusAttemptBody = z.object({
  eyes: z.object({
    RE: fundusEyeMarksSchema,
    LE: fundusEyeMarksSchema,
  }, { error: 'Measure both eyes: eyes.RE and eyes.LE.' }),
})

/** A learner's measurement of an uploaded photograph (image pixels). */
export const photoFundusAttemptBody = fundusEyeMarksSchema

export const photoReferenceBody = z.object({ disc: pointSchema, fovea: pointSchema })

export const FUNDUS_PHOTO_TITLE_MAX = 120
export const FUNDUS_PHOTO_NOTES_MAX = 2000

/** The text fields of the upload form (the file itself is checked from its bytes). */
export const photoUploadFields = z.object({
  title: z.string({ error: 'Give the photograph a title.' }).trim()
    .min(2, { error: 'The title needs at least 2 characters.' })
    .max(FUNDUS_PHOTO_TITLE_MAX, { error: `The title may have at most ${FUNDUS_PHOTO_TITLE_MAX} characters.` }),
  eye: z.enum(EYES, { error: 'Say which eye: RE or LE.' }),
  notes: z.string().trim().max(FUNDUS_PHOTO_NOTES_MAX, { error: `Notes may have at most ${FUNDUS_PHOTO_NOTES_MAX} characters.` }).optional(),
  cohortIds: z.array(z.coerce.number({ error: 'Cohorts must be cohort ids.' }).int().positive(), { error: 'Cohorts must be a list of cohort ids.' }).max(50),
  consent: z.literal('yes', { error: 'Confirm that the photograph is de-identified and used with consent.' }),
})
export type PhotoUploadFields = z.infer<typeof photoUploadFields>

/** One eye of an autosaved fundus item: whatever the learner has placed so far. */
export const fundusDraftEyeSchema = z.object({
  disc: pointSchema.nullable().default(null),
  fovea: pointSchema.nullable().default(null),
  finding: fundusFindingSchema.nullable().default(null),
}, { error: 'Each eye of the draft is { disc, fovea, finding } (each may be null).' })

export const fundusDraftEyes = z.object({
  RE: fundusDraftEyeSchema.optional(),
  LE: fundusDraftEyeSchema.optional(),
}, { error: 'The draft\'s eyes are { RE?, LE? }.' }).strict()

/** A fundus quiz item handed in: the eyes the item asks for, each fully marked (the route checks which). */
export const fundusItemAttemptBody = z.object({
  eyes: z.object({
    RE: fundusEyeMarksSchema.optional(),
    LE: fundusEyeMarksSchema.optional(),
  }, { error: 'Send the marks as { eyes: { RE?, LE? } }.' }).strict(),
}, { error: 'Send the marks as { eyes: { RE?, LE? } }.' })
export type FundusItemAttemptBody = z.infer<typeof fundusItemAttemptBody>
