// Bodies, queries and params of the practice routes (README, API) and the record
// checker. Routes validate with these; the bench and the record-checker page reuse them.
import { z } from 'zod'
import {
  attemptSubmitSchema,
  distanceSchema,
  gazeSchema,
  interpretationSchema,
  lightsSchema,
  modeSchema,
  prismSchema,
  readingSchema,
  recordCheckSchema,
  recordTextSchema,
  seedSchema,
  templateIdSchema,
} from '#shared/engine/schemas'
import { DIFFICULTIES } from '#shared/engine/types'

const positiveId = (what: string) =>
  z.coerce
    .number({ error: `${what} must be a number.` })
    .int({ error: `${what} must be a whole number.` })
    .positive({ error: `${what} must be a positive whole number.` })

export const difficultySchema = z.enum(DIFFICULTIES, { error: 'Difficulty must be "standard" or "challenging".' })

const prismsSchema = z.array(prismSchema, { error: 'Prisms must be a list of { eye, power, base }.' })
  .max(4, { error: 'At most four prisms fit the trial frame.' })

/** `template: 'any'` (or none) lets the server choose, and the case does not name it until an attempt is in. */
export const practiceStartSchema = z.object({
  template: z.union([z.literal('any'), templateIdSchema], { error: 'The case template must be an id or "any".' }).optional(),
  difficulty: difficultySchema.optional(),
  seed: seedSchema.optional(),
  mode: modeSchema.optional(),
  readScale: z.boolean({ error: 'readScale must be true or false.' }).optional(),
  /** "Another like this": same template as that case of yours, new seed. */
  like: positiveId('like (a case id)').optional(),
  /** With `like`: the challenging difficulty of the same template. */
  harder: z.boolean({ error: 'harder must be true or false.' }).optional(),
}).superRefine((b, ctx) => {
  if (b.like !== undefined && b.template !== undefined) {
    ctx.addIssue({ code: 'custom', path: ['template'], message: 'Give either a template or like (another case like one of yours), not both.' })
  }
  if (b.harder && b.difficulty === 'standard') {
    ctx.addIssue({ code: 'custom', path: ['harder'], message: 'harder asks for the challenging difficulty; it cannot go with difficulty "standard".' })
  }
})
export type PracticeStartBody = z.infer<typeof practiceStartSchema>

/** The bench state autosaved while the learner works (nothing here is checked against the case). */
export const benchDraftSchema = z.object({
  gaze: gazeSchema,
  distance: distanceSchema,
  readings: z.object({ RE: readingSchema, LE: readingSchema }, { error: 'Give both dial readings: { RE, LE }.' }),
  prisms: prismsSchema.optional().default([]),
  lights: lightsSchema.optional().default('dim'),
  record: recordTextSchema.optional().default(''),
  interpretation: interpretationSchema.optional(),
})
export type BenchDraft = z.output<typeof benchDraftSchema>

/** Patient-turns: ask the patient to turn both rods until each line looks level. */
export const turnRequestSchema = z.object({
  gaze: gazeSchema,
  distance: distanceSchema,
  prisms: prismsSchema.optional(),
  lights: lightsSchema.optional(),
})
export type TurnRequestBody = z.infer<typeof turnRequestSchema>

export const trialSchema = z
  .number({ error: 'trial must be the number of the patient\'s turn you read (1, 2, 3…).' })
  .int({ error: 'trial must be a whole number.' })
  .positive({ error: 'trial starts at 1.' })

/** An attempt on a practice case; `trial` is required in patient-turns mode (checked by the route). */
export const practiceAttemptSchema = attemptSubmitSchema.extend({
  trial: trialSchema.optional(),
})
export type PracticeAttemptBody = z.infer<typeof practiceAttemptSchema>

export const practiceHistoryQuery = z.object({
  page: z.coerce.number({ error: 'page must be a number.' }).int().min(1, { error: 'page starts at 1.' }).default(1),
  pageSize: z.coerce.number({ error: 'pageSize must be a number.' }).int().min(1, { error: 'pageSize must be at least 1.' })
    .max(100, { error: 'At most 100 rows per page.' }).default(20),
  template: templateIdSchema.optional(),
})

export const caseIdParams = z.object({ id: positiveId('The case id') })
export const attemptIdParams = z.object({ attemptId: positiveId('The attempt id') })

/**
 * The record checker's body: the known finding (signed degrees, positive = excyclo —
 * the page asks for amount + excyclo/incyclo per eye so nobody has to know the sign),
 * optional gaze, distance, dial readings and tolerance, and the written record.
 * `notTestable`: the patient could not see both streaks, so the right record says
 * the test was not performed and why.
 */
export const recordCheckBodySchema = recordCheckSchema.extend({
  notTestable: z.boolean({ error: 'notTestable must be true or false.' }).optional(),
})
export type RecordCheckBodyInput = z.input<typeof recordCheckBodySchema>
