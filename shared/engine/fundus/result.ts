// Shapes of a graded fundus measurement, shared by the routes and the pages.

import type { Eye, PerEye } from '../types'
import type { Point } from './geometry'
import type { FundusFinding, NormalRange } from './normals'

/** What a learner hands in for one eye: the two marks (picture units) and the finding. */
export interface FundusEyeMarks {
  disc: Point
  fovea: Point
  finding: FundusFinding
}

export type FundusMarkCode = 'angle-off' | 'finding-wrong' | 'finding-reversed' | 'marks-swapped'

export interface FundusMark {
  criterion: 'angle' | 'finding'
  eye: Eye
  score: 0 | 0.5 | 1
  weight: number
  reason: string
  code?: FundusMarkCode
}

export interface FundusEyeResult {
  eye: Eye
  /** The angle the learner's own marks make, degrees (computed on the server). */
  measuredAngle: number
  /** The angle of the picture (the case, or the tutor's reference marks), degrees. */
  referenceAngle: number
  finding: FundusFinding
  /** The finding the picture stands for against the normal range. */
  expectedFinding: FundusFinding
  /** Findings accepted (both sides when the angle sits within a degree of a limit). */
  acceptedFindings: FundusFinding[]
  /** How far each mark sits from the reference point, disc diameters (approximate for photographs). */
  offsets: { disc: number, fovea: number }
  marks: FundusMark[]
  notes: string[]
}

export interface FundusGradeResult {
  eyes: Partial<PerEye<FundusEyeResult>>
  /** Weighted score 0–1. */
  score: number
  points: { earned: number, possible: number }
  normalRanges: PerEye<NormalRange>
  explanation: string[]
  sources: string[]
}

/** Subjective (double Maddox rod) against objective (fundus) torsion on a case. */
export interface FundusComparison {
  /** Each eye's torsion in primary position, degrees, + = excyclo. */
  objectiveTorsion: PerEye<number>
  /** What the double Maddox rod shows in primary position, degrees, + = excyclo. */
  dmrTorsion: PerEye<number>
  /** The patient reports less torsion than the eyes have (long-standing palsy). */
  underReports: boolean
  explanation: string[]
}
