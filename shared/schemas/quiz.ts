// Bodies and queries of the quiz routes. Item kinds are a discriminated union on
// `kind` so another kind (e.g. a fundus item) can be added beside 'dmr'.
import { z } from 'zod'
import { modeSchema, toleranceSchema } from '../engine/schemas'
import { caseSourceSchema } from './casebook'
import { fundusDraftEyes } from './fundus'
import { listPaging } from './common'

/** The criteria a quiz can weigh: the grader's, the three-step interpretation, and a fundus item's two. */
export const QUIZ_CRITERIA = ['measurement', 'direction', 'amount', 'eye', 'test', 'gaze', 'distance', 'action', 'reason', 'interpretation', 'fundusAngle', 'fundusFinding'] as const
export type QuizCriterion = (typeof QUIZ_CRITERIA)[number]

export const QUIZ_ITEM_KINDS = ['dmr', 'fundus'] as const
export type QuizItemKind = (typeof QUIZ_ITEM_KINDS)[number]

/** Each kind's path segment for its attempts, in the API and the pages: `/quizzes/:id/<segment>/:attemptId`. */
export const KIND_ATTEMPT_PATHS = { dmr: 'attempts', fundus: 'fundus-attempts' } as const satisfies Record<QuizItemKind, string>

/** The criteria each item kind marks (the others never appear in its marks). */
export const KIND_CRITERIA: Record<QuizItemKind, readonly QuizCriterion[]> = {
  dmr: ['measurement', 'direction', 'amount', 'eye', 'test', 'gaze', 'distance', 'action', 'reason', 'interpretation'],
  fundus: ['fundusAngle', 'fundusFinding'],
}
export const criteriaOfKind = (kind: string): readonly QuizCriterion[] => KIND_CRITERIA[kind as QuizItemKind] ?? KIND_CRITERIA.dmr

export const CRITERION_LABELS: Record<QuizCriterion, string> = {
  measurement: 'Measurement',
  direction: 'Direction',
  amount: 'Amount',
  eye: 'Eye',
  test: 'Test named',
  gaze: 'Position of gaze',
  distance: 'Fixation distance',
  action: 'Stopped the test',
  reason: 'Reason given',
  interpretation: 'Interpretation',
  fundusAngle: 'Disc–fovea angle',
  fundusFinding: 'Objective finding',
}

const weight = (name: string) => z.number({ error: `The weight of ${name} must be a number.` })
  .min(0, { error: `The weight of ${name} cannot be negative (0 = does not count).` })
  .max(10, { error: `The weight of ${name} is at most 10.` })

export const weightsSchema = z.strictObject(
  Object.fromEntries(QUIZ_CRITERIA.map(c => [c, weight(CRITERION_LABELS[c].toLowerCase()).optional()])) as Record<QuizCriterion, z.ZodOptional<z.ZodNumber>>,
  { error: iss => iss.code === 'unrecognized_keys' ? `Criteria are: ${QUIZ_CRITERIA.join(', ')}.` : 'Weights must be an object of criterion → number.' },
)
export type Weights = Partial<Record<QuizCriterion, number>>

const promptField = z.string({ error: 'The prompt must be text.' })
  .trim()
  .max(1000, { error: 'Keep the prompt under 1000 characters.' })
const newItemPrompt = promptField.default('')

/** Each student gets their own case derived from the quiz seed (generated sources only). */
const perStudentField = z.boolean({ error: 'Per student must be true or false.' }).default(true)

/** A double Maddox rod item: one case (per student, or one for all) on the bench. */
export const dmrItemBody = z.object({
  kind: z.literal('dmr'),
  prompt: newItemPrompt,
  source: caseSourceSchema,
  perStudent: perStudentField,
  mode: modeSchema.default('patient-turns'),
  /** The learner must read the dial scale themselves (no figure shown). */
  readScale: z.boolean({ error: 'Read the scale must be true or false.' }).default(false),
  /** Default: the casebook template's or case's tolerance, else 2°. */
  tolerance: toleranceSchema.optional(),
  weights: weightsSchema.optional(),
})
export type DmrItemBody = z.input<typeof dmrItemBody>

/** Where a fundus item's picture comes from: a generated case's fundus, or a marked photograph. */
export const fundusSourceSchema = z.discriminatedUnion('type', [
  ...caseSourceSchema.options,
  z.object({ type: z.literal('photo'), id: z.number({ error: 'The photograph id must be a number.' }).int().positive({ error: 'The photograph id must be a positive whole number.' }) }),
], { error: 'The source must be { type: "engine", templateId }, { type: "template", id }, { type: "case", id } or { type: "photo", id }.' })
export type FundusItemSource = z.infer<typeof fundusSourceSchema>

/** Degrees within which a fundus item's angle earns the full mark (half within twice it). */
const fundusToleranceSchema = z.number({ error: 'The tolerance must be a number of degrees.' })
  .min(0.5, { error: 'The tolerance is at least 0.5°.' })
  .max(5, { error: 'The tolerance is at most 5°.' })

/**
 * A fundus item: the student marks the disc centre and fovea and records the
 * objective finding — on a generated case's fundus (both eyes; per student or one
 * for all, seeded like double Maddox rod items) or on a tutor's marked photograph.
 */
export const fundusItemBody = z.object({
  kind: z.literal('fundus'),
  prompt: newItemPrompt,
  source: fundusSourceSchema,
  perStudent: perStudentField,
  /** Default 1° (the practice grading's). */
  tolerance: fundusToleranceSchema.optional(),
  weights: weightsSchema.optional(),
})
export type FundusItemBody = z.input<typeof fundusItemBody>

export const quizItemBody = z.discriminatedUnion('kind', [dmrItemBody, fundusItemBody], { error: 'Item kind must be "dmr" or "fundus".' })
export type QuizItemBody = z.input<typeof quizItemBody>

/** Editing an item: the same fields, all optional (the kind cannot change). */
export const quizItemPatch = z.object({
  prompt: promptField.optional(),
  /** A photograph is a source for fundus items only (the route says so). */
  source: fundusSourceSchema.optional(),
  perStudent: z.boolean().optional(),
  mode: modeSchema.optional(),
  readScale: z.boolean().optional(),
  tolerance: toleranceSchema.optional(),
  weights: weightsSchema.optional(),
  position: z.number({ error: 'Position must be a number.' }).int().min(1, { error: 'Positions start at 1.' }).optional(),
}).refine(b => Object.keys(b).length > 0, { error: 'Nothing to change.' })

const isoTime = (what: string) => z.iso
  .datetime({ offset: true, error: `${what} must be a date and time (ISO 8601, e.g. 2026-03-01T09:00:00Z).` })
  .transform(v => new Date(v).toISOString())

const ids = z.array(z.number().int().positive(), { error: 'Cohorts must be a list of cohort ids.' }).max(50, { error: 'At most 50 cohorts.' })

const quizFields = {
  title: z.string({ error: 'Give the quiz a title.' }).trim().min(1, { error: 'Give the quiz a title.' }).max(120, { error: 'Keep the title under 120 characters.' }),
  instructions: z.string({ error: 'Instructions must be text.' }).trim().max(4000, { error: 'Keep the instructions under 4000 characters.' }),
  timeLimitMinutes: z.number({ error: 'The time limit must be a number of minutes.' }).int({ error: 'The time limit is in whole minutes.' })
    .min(1, { error: 'The time limit is at least 1 minute.' }).max(600, { error: 'The time limit is at most 600 minutes.' }).nullable(),
  opensAt: isoTime('Opens at').nullable(),
  closesAt: isoTime('Closes at').nullable(),
  attemptsAllowed: z.number({ error: 'Attempts allowed must be a number.' }).int().min(1, { error: 'Allow at least 1 attempt.' }).max(10, { error: 'At most 10 attempts per item.' }),
  interpretation: z.boolean({ error: 'Interpretation must be true or false.' }),
  holdFeedback: z.boolean({ error: 'Hold feedback must be true or false.' }),
  cohortIds: ids,
}

const closesAfterOpens = (b: { opensAt?: string | null, closesAt?: string | null }) =>
  !b.opensAt || !b.closesAt || Date.parse(b.closesAt) > Date.parse(b.opensAt)

export const quizCreateBody = z.object({
  title: quizFields.title,
  instructions: quizFields.instructions.default(''),
  timeLimitMinutes: quizFields.timeLimitMinutes.default(null),
  opensAt: quizFields.opensAt.default(null),
  closesAt: quizFields.closesAt.default(null),
  attemptsAllowed: quizFields.attemptsAllowed.default(1),
  interpretation: quizFields.interpretation.default(false),
  holdFeedback: quizFields.holdFeedback.default(true),
  cohortIds: quizFields.cohortIds.default([]),
}).refine(closesAfterOpens, { error: 'The quiz must close after it opens.', path: ['closesAt'] })
export type QuizCreateBody = z.input<typeof quizCreateBody>

export const quizPatchBody = z.object({
  title: quizFields.title.optional(),
  instructions: quizFields.instructions.optional(),
  timeLimitMinutes: quizFields.timeLimitMinutes.optional(),
  opensAt: quizFields.opensAt.optional(),
  closesAt: quizFields.closesAt.optional(),
  attemptsAllowed: quizFields.attemptsAllowed.optional(),
  interpretation: quizFields.interpretation.optional(),
  holdFeedback: quizFields.holdFeedback.optional(),
  cohortIds: quizFields.cohortIds.optional(),
  published: z.boolean({ error: 'Published must be true or false.' }).optional(),
  archived: z.boolean({ error: 'Archived must be true or false.' }).optional(),
}).refine(b => Object.keys(b).length > 0, { error: 'Nothing to change.' })
  .refine(closesAfterOpens, { error: 'The quiz must close after it opens.', path: ['closesAt'] })
export type QuizPatchBody = z.input<typeof quizPatchBody>

export const quizListQuery = z.object({
  archived: z.enum(['0', '1'], { error: 'Archived must be 0 or 1.' }).default('0'),
  ...listPaging,
})

export const quizItemParams = z.object({
  id: z.coerce.number({ error: 'The quiz id must be a number.' }).int().positive({ error: 'The quiz id must be a positive whole number.' }),
  itemId: z.coerce.number({ error: 'The item id must be a number.' }).int().positive({ error: 'The item id must be a positive whole number.' }),
})

export const quizItemPictureParams = quizItemParams.extend({
  eye: z.enum(['RE', 'LE'], { error: 'The eye must be RE or LE.' }),
})

export const quizStudentCaseParams = quizItemParams.extend({
  studentId: z.coerce.number({ error: 'The student id must be a number.' }).int().positive({ error: 'The student id must be a positive whole number.' }),
})

export const quizAttemptParams = z.object({
  id: z.coerce.number({ error: 'The quiz id must be a number.' }).int().positive({ error: 'The quiz id must be a positive whole number.' }),
  attemptId: z.coerce.number({ error: 'The attempt id must be a number.' }).int().positive({ error: 'The attempt id must be a positive whole number.' }),
})

export const overrideBody = z.object({
  criterion: z.enum(QUIZ_CRITERIA, { error: `Criterion must be one of: ${QUIZ_CRITERIA.join(', ')}.` }),
  score: z.number({ error: 'The new mark must be a number from 0 to 1.' }).min(0, { error: 'The new mark must be from 0 to 1.' }).max(1, { error: 'The new mark must be from 0 to 1.' }),
  reason: z.string({ error: 'Give a reason for the change.' }).trim().min(3, { error: 'Give a reason for the change (at least 3 characters).' }).max(1000, { error: 'Keep the reason under 1000 characters.' }),
})
export type OverrideBody = z.infer<typeof overrideBody>

/** A student's autosaved fundus item: the marks so far, per eye (any may be missing). */
export const fundusItemDraftBody = z.object({ eyes: fundusDraftEyes }, { error: 'Send the marks as { eyes: { RE?, LE? } }.' })
export type FundusItemDraft = z.infer<typeof fundusItemDraftBody>

export const RESULT_SORTS = ['name', 'total', 'slips', 'time', 'status'] as const

export const resultsQuery = z.object({
  q: z.string().trim().max(100).optional(),
  cohortId: z.coerce.number().int().positive().optional(),
  status: z.enum(['not-started', 'in-progress', 'finished'], { error: 'Status must be not-started, in-progress or finished.' }).optional(),
  sort: z.union([z.enum(RESULT_SORTS), z.string().regex(/^item-\d+$/)], { error: `Sort by ${RESULT_SORTS.join(', ')} or item-<id>.` }).default('name'),
  dir: z.enum(['asc', 'desc'], { error: 'Direction must be asc or desc.' }).default('asc'),
  page: z.coerce.number().int().min(1, { error: 'Page starts at 1.' }).default(1),
  pageSize: z.coerce.number().int().min(5, { error: 'At least 5 rows per page.' }).max(100, { error: 'At most 100 rows per page.' }).default(25),
})
export type ResultsQuery = z.output<typeof resultsQuery>
