// Response shapes of the quiz routes, shared by the routes and the pages.
import type { MarkCap } from '../engine/marking'
import type { Presentation, PatientTurnsResult } from '../engine/presentation'
import type { Mode, Eye } from '../engine/types'
import type { NarrowedRanges } from '../schemas/casebook'
import type { QuizCriterion, QuizItemKind, FundusItemDraft } from '../schemas/quiz'
import type { FundusComparison, FundusEyeMarks, FundusGradeResult } from '../engine/fundus/result'
import type { FundusPresentation } from '../engine/fundus/picture'
import type { Point } from '../engine/fundus/geometry'
import type { BenchDraft } from '../schemas/practice'
import type { AttemptResult, BenchAsLeft, CaseTruthView } from './practice'

export type QuizPhase = 'draft' | 'upcoming' | 'open' | 'closed'
export type SittingStatus = 'not-started' | 'in-progress' | 'finished'

export interface QuizSettings {
  id: number
  title: string
  instructions: string
  timeLimitMinutes: number | null
  opensAt: string | null
  closesAt: string | null
  attemptsAllowed: number
  interpretation: boolean
  holdFeedback: boolean
  phase: QuizPhase
  published: boolean
  archived: boolean
  releasedAt: string | null
  /** Feedback is open to students (released, or closed without holding feedback). */
  feedbackOpen: boolean
}

export interface StaffQuizSummary extends QuizSettings {
  ownerName: string | null
  mine: boolean
  /** May change quiz-wide settings (times, items, publishing, release): the owner, lecturers and admins. */
  canManage: boolean
  cohorts: { id: number, name: string }[]
  itemCount: number
  students: number
  started: number
  finished: number
}

export type StaffItemSource
  = | { type: 'engine', templateId: string, title: string }
    | { type: 'template', id: number, templateId: string, ranges: NarrowedRanges, title: string }
    | { type: 'case', id: number, title: string }
    | { type: 'photo', id: number, title: string, eye: Eye, angle: number }

export interface StaffQuizItem {
  id: number
  position: number
  kind: QuizItemKind
  prompt: string
  source: StaffItemSource
  perStudent: boolean
  /** Double Maddox rod items only (null on a fundus item). */
  mode: Mode | null
  readScale: boolean
  tolerance: number
  weights: Record<QuizCriterion, number>
}

export interface StaffQuizDetail extends StaffQuizSummary {
  items: StaffQuizItem[]
  /** Items and the interpretation setting are fixed once a student has started. */
  locked: boolean
  assignableCohorts: { id: number, name: string }[]
}

export interface StudentSitting {
  status: SittingStatus
  startedAt: string | null
  deadline: string | null
  finishedAt: string | null
}

/** GET /api/quizzes: one page of the list, newest opening first. */
export interface QuizPage<T> {
  items: T[]
  total: number
  page: number
  pageSize: number
}

export interface StudentQuizSummary {
  id: number
  title: string
  instructions: string
  phase: QuizPhase
  opensAt: string | null
  closesAt: string | null
  timeLimitMinutes: number | null
  attemptsAllowed: number
  interpretation: boolean
  itemCount: number
  feedbackOpen: boolean
  sitting: StudentSitting
}

/** An attempt's result as the student sees it once feedback is open: the tutor's overrides applied. */
export interface StudentItemFeedback extends Omit<AttemptResult, 'marks'> {
  marks: { criterion: QuizCriterion, score: number, weight: number, reason: string, overridden: boolean }[]
}

/** A fundus item's feedback once it is open: the grading, the item's marks with overrides, and (on a case) subjective against objective. */
export interface StudentFundusFeedback {
  attemptId: number
  result: FundusGradeResult
  marks: { criterion: QuizCriterion, score: number, weight: number, reason: string, overridden: boolean }[]
  score: number
  points: { earned: number, possible: number }
  comparison: FundusComparison | null
}

export interface StudentQuizItem {
  id: number
  position: number
  kind: QuizItemKind
  prompt: string
  /** Double Maddox rod items only (null on a fundus item). */
  mode: Mode | null
  readScale: boolean
  saved: boolean
  attempts: number
  attemptsLeft: number
  lastSubmittedAt: string | null
  feedback?: StudentItemFeedback
  fundusFeedback?: StudentFundusFeedback
}

export interface StudentQuizDetail extends StudentQuizSummary {
  items: StudentQuizItem[]
  total?: { earned: number, possible: number, score: number }
}

/** What the bench needs to sit one item (never the truth). */
export interface StudentItemCase {
  kind: 'dmr'
  quizId: number
  itemId: number
  position: number
  prompt: string
  caseId: number
  mode: Mode
  readScale: boolean
  interpretation: boolean
  presentation: Presentation
  /** The autosaved bench, as the practice API stores it. */
  draft: (BenchDraft & { savedAt: string }) | null
  turns: PatientTurnsResult[]
  attempts: { attemptId: number, submittedAt: string }[]
  attemptsLeft: number
  deadline: string | null
  serverNow: string
}

/** A picture as an image to mark: its route and its size in the units the marks are in. */
export interface FundusItemImage { imageUrl: string, width: number, height: number, eye: Eye }

/**
 * What the fundus marker needs to sit a fundus item: the pictures of the eyes to
 * measure (a case's fundus rendered to pixels on the server, or a photograph's
 * image route and size) — never the reference marks, the disc and fovea
 * coordinates, the angle or the finding.
 */
export interface StudentFundusItem {
  kind: 'fundus'
  quizId: number
  itemId: number
  position: number
  prompt: string
  eyes: Eye[]
  /** Always null for a student: a generated case's geometry stays on the server during a sitting. */
  presentation: FundusPresentation | null
  /** A generated case's fundus per eye, as PNGs rendered on the server (GET …/items/:itemId/pictures/:eye), sized in disc diameters. */
  pictures: Partial<Record<Eye, FundusItemImage>> | null
  /** A photograph: served by /api/fundus/photos/:id/image to the quiz's students. */
  photo: FundusItemImage | null
  draft: (FundusItemDraft & { savedAt: string }) | null
  attempts: { attemptId: number, submittedAt: string }[]
  attemptsLeft: number
  deadline: string | null
  serverNow: string
}

export type StudentQuizItemPage = StudentItemCase | StudentFundusItem

export interface QuizAttemptReceipt {
  attemptId: number
  submittedAt: string
  attemptsLeft: number
  message: string
}

// ---- results ---------------------------------------------------------------

export interface EffectiveMark {
  criterion: QuizCriterion
  score: number
  weight: number
  reason: string
  /** Set when a tutor changed this mark. */
  override?: { previousScore: number, reason: string, by: string | null, at: string }
}

export interface ItemCell {
  attemptId: number | null
  attempts: number
  submittedAt: string | null
  /** Points earned / possible on the attempt that counts (null = not submitted). */
  earned: number | null
  possible: number | null
  marks: EffectiveMark[]
  slips: string[]
  /** Set when a critical slip holds the item to at most half its points. */
  cap: MarkCap | null
  overridden: boolean
  /** Saved bench state but nothing submitted. */
  draftOnly: boolean
}

export interface StudentResult {
  studentId: number
  name: string
  email: string
  cohortId: number
  cohortName: string
  status: SittingStatus
  startedAt: string | null
  finishedAt: string | null
  timeTakenMs: number | null
  items: Record<number, ItemCell>
  earned: number
  possible: number
  /** 0–1 over every item's possible points (unsubmitted items count as 0). */
  score: number
  slips: number
}

export interface ResultsColumn {
  id: number
  position: number
  kind: QuizItemKind
  /** The item's source title (names the condition: staff only). */
  title: string
  possible: number
  criteria: { criterion: QuizCriterion, label: string }[]
}

export interface QuizResultsResponse {
  quiz: QuizSettings
  columns: ResultsColumn[]
  items: StudentResult[]
  total: number
  page: number
  pageSize: number
  /** meanScore: the mean of those who finished; null while nobody has. */
  summary: { students: number, started: number, finished: number, meanScore: number | null }
  /** What *Release results* would do: students e-mailed (all of the quiz's cohorts, those who never sat included). Null unless the caller may release and it has not been released. */
  release?: { students: number, neverSat: number } | null
}

/** One quiz attempt opened for review (staff always; the student, marks only once feedback is open). */
/** A tutor's change to one mark, as an attempt's page lists it. */
export interface MarkOverrideView { criterion: string, previousScore: number, score: number, reason: string, by: string | null, at: string }

export interface QuizAttemptView {
  quiz: { id: number, title: string }
  item: { id: number, position: number, prompt: string, mode: Mode, readScale: boolean, title?: string, tolerance?: number }
  student: { id: number, name: string, email?: string }
  /** The attempt that counts (the student's last on the item). */
  counts: boolean
  attempt: { id: number } & BenchAsLeft & {
    interpretation: unknown
    startedAt: string | null
    submittedAt: string
  }
  /** Patient-turns: where the patient left the rods on the trial the student read. */
  turn: PatientTurnsResult | null
  case: { id: number, mode: Mode, readScale: boolean, presentation: Presentation }
  feedbackOpen: boolean
  result: StudentItemFeedback | null
  overrides: MarkOverrideView[]
}

/** One fundus quiz attempt opened for review (staff always; the student, marks and the reference only once feedback is open). */
export interface QuizFundusAttemptView {
  quiz: { id: number, title: string }
  item: { id: number, position: number, prompt: string, eyes: Eye[], title?: string, tolerance?: number }
  student: { id: number, name: string, email?: string }
  counts: boolean
  attempt: { id: number, marks: Partial<Record<Eye, FundusEyeMarks>>, submittedAt: string }
  /** Staff, and the student once feedback is open: the generated picture's geometry. */
  presentation: FundusPresentation | null
  /** The student before feedback opens: the generated picture as server-rendered pixels. */
  pictures: Partial<Record<Eye, FundusItemImage>> | null
  photo: FundusItemImage | null
  feedbackOpen: boolean
  /** The picture's own disc centre and fovea per eye (with the feedback). */
  reference: Partial<Record<Eye, { disc: Point, fovea: Point }>> | null
  result: StudentFundusFeedback | null
  overrides: MarkOverrideView[]
}

/** GET /api/quizzes/cohorts: a cohort the caller may assign. */
export interface CohortChoice { id: number, name: string }

/** POST /api/quizzes/:id/release. */
export interface QuizReleased { releasedAt: string | null, mailed: number, gradesQueued?: number, message: string }

/** GET /api/quizzes/:id/items/:itemId/cases/:studentId on a double Maddox rod item: the student's patient, with its truth. */
export interface StaffDmrCasePreview {
  kind: 'dmr'
  student: { id: number, name: string }
  item: { id: number, position: number, prompt: string, mode: Mode, readScale: boolean }
  /** Whether the student has opened it (else it is the case their seed derives). */
  stored: boolean
  caseId: number | null
  seed: string
  presentation: Presentation
  draft: BenchDraft | null
  truth: CaseTruthView
}

/** The same on a fundus item: the picture, the student's saved marks, the reference points and angles. */
export interface StaffFundusCasePreview {
  kind: 'fundus'
  student: { id: number, name: string }
  item: { id: number, position: number, prompt: string, eyes: Eye[] }
  stored: boolean
  caseId: number | null
  seed: string | null
  presentation: FundusPresentation | null
  photo: FundusItemImage | null
  draft: (FundusItemDraft & { savedAt: string }) | null
  reference: Partial<Record<Eye, { disc: Point, fovea: Point }>>
  angles: Partial<Record<Eye, number | null>>
}

export type StaffCasePreview = StaffDmrCasePreview | StaffFundusCasePreview
