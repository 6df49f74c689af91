// Response shapes of the practice routes and the record checker, shared by the
// routes (which `satisfies` them) and the pages. Nothing here is secret: a case's
// truth appears only in `CaseTruthView`, sent once an attempt is in.
import type { MarkCap } from '#shared/engine/marking'
import type { PatientTurnsResult, Presentation } from '#shared/engine/presentation'
import type { ParsedRecord } from '#shared/engine/parser'
import type { Slip } from '#shared/engine/slips'
import type { Difficulty, Distance, Gaze, Lights, Mode, PerEye, Prism, RecordedDirection } from '#shared/engine/types'
import type { BenchDraft } from '#shared/schemas/practice'

export type { BenchDraft, PatientTurnsResult, Presentation }

export interface PracticeTemplateItem {
  /** Base id without difficulty, e.g. `so-palsy-right`. */
  id: string
  /** Names the condition: the learner chose to see the list. */
  title: string
  difficulties: Difficulty[]
}

export interface PracticeCase {
  id: number
  /** Null while the template is hidden. */
  seed: string | null
  /** Base template id; null while the server's choice ("any") is still hidden. */
  template: string | null
  title: string | null
  difficulty: Difficulty
  mode: Mode
  readScale: boolean
  presentation: Presentation
}

export interface MarkView {
  criterion: string
  /** 0, 0.5 or 1. */
  score: number
  weight: number
  reason: string
}

export interface CaseTruthView {
  label: string
  condition: string
  gaze: Gaze
  /** Signed degrees, positive = excyclo: what the double Maddox rod shows. */
  torsion: PerEye<number>
  objectiveTorsion: PerEye<number>
  directions: PerEye<RecordedDirection>
  levelAt: PerEye<number>
  palsiedMuscles: string[]
  modelRecord: string
  sources: string[]
}

export interface InterpretationView {
  marks: { criterion: 'higher-eye' | 'worse-gaze' | 'worse-tilt' | 'muscle', score: number, reason: string }[]
  score: number
  /** The right answer: a muscle code or 'not-applicable'. */
  answer: string
  explanation: string[]
}

/** A practice attempt's result: the case's title too, now that the attempt reveals it (null only for a case that stays unnamed). */
export type PracticeAttemptResult = AttemptResult & { caseTitle: string | null }

export interface AttemptResult {
  attemptId: number
  readAs: string
  marks: MarkView[]
  score: number
  points: { earned: number, possible: number }
  /** Set when a critical slip holds the score to at most half. */
  cap: MarkCap | null
  slips: Slip[]
  explanation: string[]
  modelRecord: string
  truth: CaseTruthView
  interpretation?: InterpretationView
}

export interface AttemptSummary extends AttemptResult {
  submittedAt: string
  gaze: Gaze
  distance: Distance
  trial: number | null
}

export interface PracticeCaseDetail extends PracticeCase {
  draft: (BenchDraft & { savedAt: string }) | null
  /** Patient-turns: every turn so far, in order. */
  turns: PatientTurnsResult[]
  attempts: AttemptSummary[]
}

export interface PracticeHistoryItem {
  attemptId: number
  caseId: number
  submittedAt: string
  title: string
  mode: Mode
  score: number
  slips: Slip[]
}

export interface PracticeHistory {
  items: PracticeHistoryItem[]
  total: number
  page: number
  pageSize: number
}

/** The bench as the learner left it on submitting: gaze, distance, readings, prisms, lights, the record and the trial read. */
export interface BenchAsLeft {
  gaze: Gaze
  distance: Distance
  readings: PerEye<number>
  prisms: Prism[]
  lights: Lights
  record: string
  trial: number | null
}

export interface AttemptReplay {
  attempt: BenchAsLeft & { submittedAt: string }
  result: Omit<AttemptResult, 'attemptId'>
  case: { id: number, title: string, mode: Mode, readScale: boolean, presentation: Presentation }
}

/**
 * A written record graded: how it was read, the marks, the score and points after the
 * cap of critical slips, the slips, the model record and the explanation. `M` is the
 * mark: the grader's own (server/lib/engine/grader.ts `GradeResult`) or as shown.
 */
export interface RecordGrade<M = MarkView> {
  readAs: string
  parsed: ParsedRecord
  marks: M[]
  /** Weighted score, 0–1, after the cap of critical slips. */
  score: number
  points: { earned: number, possible: number }
  /** Set when a critical slip holds the score to at most half. */
  cap: MarkCap | null
  slips: Slip[]
  modelRecord: string
  explanation: string[]
}

/** `POST /api/practice/record-check`: a record checked against a case's finding. */
export type RecordCheckResult = RecordGrade
