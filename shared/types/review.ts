// Response shapes of the slip-patterns review routes (server/api/review/**).
import type { SlipCode } from '#shared/engine/slips'
import type { Eye } from '#shared/engine/types'
import type { PatternCode } from '#shared/review/patterns'
import type { AmountBand, ReviewFilters } from '#shared/schemas/review'
import type { AttemptResult, BenchDraft, PatientTurnsResult, Presentation } from './practice'

export interface ReviewTotals {
  attempts: number
  /** Only where the route counts them (GET /api/review/learners gives learnersSeen). */
  learners?: number
}

export interface SlipCount {
  code: SlipCode
  title: string
  /** Slips recorded (an attempt that slips in both eyes counts twice). */
  count: number
  /** Slips per 100 attempts in the view. */
  per100: number
}

/** recorded direction → attempts, for one true direction of one eye. */
export type DirectionRow = Record<'excyclo' | 'incyclo' | 'none' | 'missing', number>
export type DirectionTable = Record<Eye, Record<'excyclo' | 'incyclo', DirectionRow>>

export interface SlipsResponse {
  filters: ReviewFilters
  totals: ReviewTotals
  slips: SlipCount[]
  directions: DirectionTable
}

export interface AmountBandCount { band: AmountBand, label: string, RE: number, LE: number }
export interface AmountsResponse { filters: ReviewFilters, bands: AmountBandCount[], recorded: Record<Eye, number> }

export interface TrendWeek {
  /** Monday of the week, YYYY-MM-DD. */
  week: string
  attempts: number
  /** Slips of each code that week. */
  slips: Partial<Record<SlipCode, number>>
}
export interface TrendResponse { filters: ReviewFilters, weeks: TrendWeek[], codes: SlipCode[] }

export interface PatternEvidence {
  code: PatternCode
  title: string
  eye?: Eye
  count: number
  of: number
  /** The most recent attempts that show it. */
  examples: number[]
}

export interface LearnerRow {
  learner: { id: number, name: string, cohort: string | null }
  attempts: number
  slipAttempts: number
  reversed: { reOnly: number, leOnly: number, both: number }
  /** One-eye reversals (by the reversed eye) whose other eye was torted and recorded rightly: the only evidence of a rule swap. */
  ruleSwap: { RE: number, LE: number }
  patterns: PatternEvidence[]
  score: number
}
export interface LearnersResponse { filters: ReviewFilters, items: LearnerRow[], total: number, learnersSeen: number }

export interface ReviewAttemptRow {
  id: number
  learner: { id: number, name: string }
  cohort: string | null
  kind: 'practice' | 'quiz'
  quizId: number | null
  quizTitle: string | null
  templateId: string | null
  condition: string
  submittedAt: string
  score: number
  record: string
  slips: { code: SlipCode, eye?: Eye }[]
}
export interface ReviewAttemptsResponse { items: ReviewAttemptRow[], total: number, page: number, pageSize: number }

/** GET /api/review/attempts/:id — one attempt replayed for staff. */
export interface StaffAttemptReplay {
  attempt: BenchDraft & { id: number, trial: number | null, submittedAt: string }
  result: AttemptResult
  case: { id: number, title: string, mode: 'learner-turns' | 'patient-turns', condition: string, difficulty: string, readScale: boolean, presentation: Presentation | null }
  turns: PatientTurnsResult[]
  learner: { id: number, name: string }
  cohort: { id: number, name: string } | null
  kind: 'practice' | 'quiz'
  quizId: number | null
}

/** A slip rate: attempts, those with the slip, and the rate per 100. */
export interface SlipRate { attempts: number, slipped: number, rate: number | null }
/** GET /api/review/practice-sets/:id — did the targeted slip become rarer after the set was sent? */
export interface PracticeSetDetail {
  id: number
  title: string
  focus: string
  focusTitle: string
  eye: string | null
  scope: string
  size: number
  mode: string
  note: string | null
  createdAt: string
  sender: string | null
  cohort: string | null
  slips: { code: string, title: string }[]
  conditions: { condition: string, cases: number }[]
  before: SlipRate
  after: SlipRate
  learners: { learner: { id: number, name: string }, sentAt: string, casesDone: number, before: SlipRate, after: SlipRate }[]
}

/** One row of GET /api/review/practice-sets. */
export interface PracticeSetRow { id: number, title: string, focusTitle: string, eye: string | null, scope: string, size: number, createdAt: string, sender: string | null, cohort: string | null, learners: number }

/** GET /api/review/options: what the review filters offer the caller. */
export interface ReviewOptions {
  cohorts: { id: number, name: string }[]
  templates: { id: string, label: string }[]
  conditions: string[]
  quizzes: { id: number, title: string }[]
  role: string
}

/** GET /api/practice-sets (student): one set a tutor sent; case ids only. */
export interface AssignedPracticeSet { id: number, title: string, note: string | null, mode: string, sentAt: string, sender: string | null, cases: { id: number, number: number, attempted: boolean }[], done: number }

/** POST /api/review/practice-sets: the set made. */
export interface PracticeSetMade { id: number, title: string, learners: number, casesPerLearner: number }
