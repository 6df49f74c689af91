// Shapes produced by the record parser (domain.md §5.1).

import type { Distance, Eye, Gaze, PerEye, Prism, RecordedDirection } from '../types'

export type TestName = 'double-maddox-rod' | 'single-maddox-rod' | 'maddox-rod'

/** One eye's entry, or the total. `null` = that part was not written (or could not be read). */
export interface EyeRecord {
  amount: number | null
  direction: RecordedDirection | null
}

export interface GazeSection {
  gaze: Gaze | null
  /** "20° downgaze" → 20. */
  gazeDegrees?: number
  eyes: Partial<PerEye<EyeRecord>>
  total?: EyeRecord
  /** Findings written without an eye ("8° excyclo"): kept so the grader marks them, with the eye missing. */
  unplaced?: EyeRecord[]
}

export type NotPerformedReason = 'suppression' | 'one-streak' | 'abnormal-correspondence' | 'unstated'

export const PROBLEM_CODES = [
  'nothing-recorded',
  'amount-without-eye',
  'both-eyes-amount',
  'two-amounts',
  'two-directions',
  'amount-and-no-torsion',
  'ambiguous-in',
  'signed-amount',
  'eye-twice',
  'unclear-eye',
  'two-distances',
  'two-tests',
  'two-gazes',
  'unclear-total',
  'not-performed-with-findings',
  'unclear-spelling',
] as const
export type ProblemCode = (typeof PROBLEM_CODES)[number]

/** Something the parser refused to guess. The learner sees the message in "read as". */
export interface RecordProblem {
  code: ProblemCode
  message: string
  eye?: Eye
  /** The words concerned, as written (lower-cased). */
  text?: string
}

export interface ParsedRecord {
  test: TestName | null
  distance: Distance | null
  /** Position of gaze of the first (usually only) section. */
  gaze: Gaze | null
  gazeDegrees?: number
  /** Findings of the first section. */
  eyes: Partial<PerEye<EyeRecord>>
  total?: EyeRecord
  /** One entry per position of gaze recorded, in the order written (always at least one). */
  sections: GazeSection[]
  /** Set when the record says the test was not performed, with the reasons it gives. */
  notPerformed: { reasons: NotPerformedReason[] } | null
  /** Prisms named in the record (e.g. "4Δ BD RE"). */
  prisms: Prism[]
  /** Recognised but not graded (correction, head tilt, vertical deviation, awareness…). */
  notes: string[]
  /** Words the parser could not read. */
  unread: string[]
  problems: RecordProblem[]
  /** Misspelt words read as the trade word they are one or two letters off. */
  spelling: Array<{ written: string, readAs: string }>
}
