// The truth about a case. Server-only: none of this may reach the browser except
// through toPresentation (presentation.ts), which strips everything that labels it.

import type { Behaviour, Condition } from '#shared/engine/case-spec'
import type { Difficulty, Eye, Gaze, Muscle, PerDistance, PerEye } from '#shared/engine/types'

export type { Behaviour, Condition }

export interface GazeFinding {
  /** Objective torsion of each eye, signed degrees, positive = excyclo. */
  torsion: PerEye<number>
  /** What the double Maddox rod shows in this position (equals `torsion` unless the patient adapts). */
  reported: PerEye<number>
  /** Δ, positive = right eye higher (R/L). */
  vertical: number
  /** Δ, positive = eso, negative = exo. */
  horizontal: PerDistance<number>
}

export interface ResponseModel {
  /** SD of the patient's "level"/"parallel" judgement from one trial to the next, degrees. */
  reliabilitySd: number
  /** Tilt below which the patient calls a line level or two lines parallel, degrees. */
  parallelThreshold: number
  behaviours: Behaviour[]
  /** Whose streak is seen when the patient sees only one. */
  seenEye?: Eye
}

export interface Case {
  generatorVersion: number
  seed: string
  /** null for a hand-authored case. */
  templateId: string | null
  condition: Condition
  difficulty: Difficulty | null
  label: string
  affectedEye: Eye | null
  /** The palsied muscle(s), when the condition is a palsy. */
  palsiedMuscles: Muscle[]
  fixingEye: Eye
  gazes: Record<Gaze, GazeFinding>
  /** Vertical deviation in primary position with the head tilted to the right / left, Δ (R/L +). */
  headTilt: { right: number, left: number }
  /** Vertical deviation in primary position lying down, Δ (R/L +). */
  supine: number
  response: ResponseModel
  /** What the patient says on sitting down. */
  opening: string
  sources: string[]
}
