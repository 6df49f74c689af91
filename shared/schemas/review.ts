// Query and body schemas for the slip-patterns review (pages and routes share them).
import { z } from 'zod'
import { CONDITIONS } from '#shared/engine/case-spec'
import { SLIP_CODES } from '#shared/engine/slips'
import { PATTERN_CODES } from '#shared/review/patterns'

const isoDay = (what: string) => z.string().regex(/^\d{4}-\d{2}-\d{2}$/, { error: `${what} must be a date as YYYY-MM-DD.` })
  .refine(v => !Number.isNaN(Date.parse(`${v}T00:00:00Z`)) && new Date(`${v}T00:00:00Z`).toISOString().startsWith(v), { error: `${what} is not a real date.` })
const positiveId = (what: string) => z.coerce.number({ error: `${what} must be a number.` }).int({ error: `${what} must be a whole number.` }).positive({ error: `${what} must be a positive whole number.` })
const emptyToUndefined = (v: unknown) => (v === '' || v === null ? undefined : v)

export const EYE_FILTERS = ['RE', 'LE'] as const
export const KIND_FILTERS = ['practice', 'quiz'] as const

/** The filters of the slip-patterns page, as query parameters. Empty strings mean "any". */
export const reviewFilterFields = {
  cohortId: z.preprocess(emptyToUndefined, positiveId('Cohort').optional()),
  kind: z.preprocess(emptyToUndefined, z.enum(KIND_FILTERS, { error: 'Kind must be practice or quiz.' }).optional()),
  quizId: z.preprocess(emptyToUndefined, positiveId('Quiz').optional()),
  from: z.preprocess(emptyToUndefined, isoDay('From').optional()),
  to: z.preprocess(emptyToUndefined, isoDay('To').optional()),
  template: z.preprocess(emptyToUndefined, z.string().regex(/^[a-z0-9-]{1,64}$/, { error: 'Template must be a case template id.' }).optional()),
  condition: z.preprocess(emptyToUndefined, z.enum(CONDITIONS, { error: 'Condition is not one Cyclodial knows.' }).optional()),
  eye: z.preprocess(emptyToUndefined, z.enum(EYE_FILTERS, { error: 'Eye must be RE or LE.' }).optional()),
}

const datesInOrder = (q: { from?: string, to?: string }) => !q.from || !q.to || q.from <= q.to
const datesMessage = { error: 'From must not be after To.', path: ['to'] }

export const reviewFilterQuery = z.object(reviewFilterFields).refine(datesInOrder, datesMessage)
export type ReviewFilters = z.output<typeof reviewFilterQuery>

export const DIRECTION_VALUES = ['excyclo', 'incyclo'] as const
export const RECORDED_DIRECTION_VALUES = ['excyclo', 'incyclo', 'none', 'missing'] as const
export const AMOUNT_BANDS = ['under-5', 'minus-5-2', 'within-2', 'plus-2-5', 'plus-5-30', 'dial-figure'] as const
export type AmountBand = (typeof AMOUNT_BANDS)[number]

/** Drill-down: the filters plus what the clicked number counted. */
export const reviewAttemptsQuery = z.object({
  ...reviewFilterFields,
  code: z.preprocess(emptyToUndefined, z.enum(SLIP_CODES, { error: 'Code must be a slip code.' }).optional()),
  learnerId: z.preprocess(emptyToUndefined, positiveId('Learner').optional()),
  trueDirection: z.preprocess(emptyToUndefined, z.enum(DIRECTION_VALUES, { error: 'True direction must be excyclo or incyclo.' }).optional()),
  recordedDirection: z.preprocess(emptyToUndefined, z.enum(RECORDED_DIRECTION_VALUES, { error: 'Recorded direction must be excyclo, incyclo, none or missing.' }).optional()),
  amountBand: z.preprocess(emptyToUndefined, z.enum(AMOUNT_BANDS, { error: 'Amount band is not one of the bands shown.' }).optional()),
  page: z.coerce.number().int().min(1, { error: 'Page starts at 1.' }).default(1),
  pageSize: z.coerce.number().int().min(5).max(100, { error: 'At most 100 rows per page.' }).default(25),
}).refine(datesInOrder, datesMessage)
  .refine(q => !(q.trueDirection || q.recordedDirection || q.amountBand) || q.eye, { error: 'Choose an eye (RE or LE) to drill into a direction or amount.', path: ['eye'] })
export type ReviewAttemptsQuery = z.output<typeof reviewAttemptsQuery>

export const reviewLearnersQuery = z.object({
  ...reviewFilterFields,
  limit: z.coerce.number().int().min(1).max(200, { error: 'At most 200 learners at once.' }).default(50),
}).refine(datesInOrder, datesMessage)

export const EXPORT_TABLES = ['slips', 'directions', 'amounts', 'trend', 'learners', 'attempts'] as const
export const reviewExportQuery = z.object({
  ...reviewFilterFields,
  table: z.enum(EXPORT_TABLES, { error: `Table must be one of ${EXPORT_TABLES.join(', ')}.` }),
}).refine(datesInOrder, datesMessage)

export const PRACTICE_SET_SIZE = { min: 3, max: 12, default: 6 } as const

export const practiceSetBody = z.object({
  learnerIds: z.array(z.number().int().positive(), { error: 'Learners must be a list of learner ids.' }).min(1, { error: 'Choose at least one learner.' }).max(200).optional(),
  cohortId: z.number({ error: 'Cohort must be a cohort id.' }).int().positive().optional(),
  focus: z.enum(PATTERN_CODES, { error: 'Focus must be one of the slip patterns.' }),
  eye: z.enum(EYE_FILTERS, { error: 'Eye must be RE or LE.' }).optional(),
  size: z.number({ error: 'Size must be a number of cases.' }).int().min(PRACTICE_SET_SIZE.min, { error: `At least ${PRACTICE_SET_SIZE.min} cases.` }).max(PRACTICE_SET_SIZE.max, { error: `At most ${PRACTICE_SET_SIZE.max} cases.` }).default(PRACTICE_SET_SIZE.default),
  note: z.string().trim().max(1000, { error: 'The note is too long (1000 characters at most).' }).optional(),
}).refine(b => (b.learnerIds ? 1 : 0) + (b.cohortId ? 1 : 0) === 1, { error: 'Send the set to some learners or to a whole cohort (one, not both).', path: ['learnerIds'] })
  .refine(b => b.focus !== 'left-right-rule-swapped' || b.eye, { error: 'Say which eye’s rule is swapped (RE or LE).', path: ['eye'] })
export type PracticeSetBody = z.output<typeof practiceSetBody>
