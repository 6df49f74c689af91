// The browser-facing view of a case: enough to draw the patient's view and to
// put words in the patient's mouth, and nothing that labels the answer. It never
// carries the condition, the case template, a signed torsion, a direction label
// or the expected record (architecture.md, "The boundary that matters").

import type { Distance, Eye, Gaze, Mode, PatientWords, PerDistance, PerEye, StreakColour, StreakPattern } from './types'

export const PRESENTATION_VERSION = 1

export interface StreakLook {
  colour: StreakColour
  /** Told apart by pattern too, for learners who do not see red well. */
  pattern: StreakPattern
}

/** What the words need about how this patient answers. */
export interface ResponseCues {
  /** 'coarse' patients answer vaguely and less consistently. */
  reliability: 'fine' | 'coarse'
  /** Degrees of tilt below which the patient calls a line level, or two lines parallel. */
  threshold: number
  /** Whether the patient sees both streaks, one, or one that comes and goes. */
  streaksSeen: 'both' | 'one' | 'intermittent'
  /** Whose streak is seen when not both. */
  seenEye?: Eye
}

export interface PositionView {
  /** Misalignment of the eyes, Δ: vertical + = right eye higher; horizontal + = eso. */
  alignment: { vertical: number, horizontal: PerDistance<number> }
  /**
   * Learner-turns only: the rod-axis reading (ISO 8429) at which each eye's streak
   * looks horizontal in a dim room with no prism. The bench adds the prism artefact
   * with `effectiveHorizontalAt` and turns it into a perceived angle live.
   */
  horizontalAt?: PerEye<number>
}

/** Cover-test measurements for the interpretation step (cases with vertical findings). */
export interface CoverTest {
  /** Vertical deviation in Δ at near, + = right eye higher (R/L), − = left eye higher. */
  gaze: Record<Gaze, number>
  /** Primary position with the head tilted to the patient's right / left. */
  headTilt: { right: number, left: number }
  /** Primary position lying down (upright–supine test). */
  supine: number
}

export interface Presentation {
  presentationVersion: typeof PRESENTATION_VERSION
  generatorVersion: number
  mode: Mode
  fixingEye: Eye
  streaks: PerEye<StreakLook>
  response: ResponseCues
  /** Seeds the variation in the patient's words; opaque. */
  wordsKey: string
  /** What the patient says when they sit down. */
  opening: string
  positions: Record<Gaze, PositionView>
  coverTest?: CoverTest
}

/** Patient-turns mode: what the server returns when the patient has turned the rods. */
export interface PatientTurnsResult {
  gaze: Gaze
  distance: Distance
  /** Which repeat this is; the same trial always gives the same setting. */
  trial: number
  /** Where the patient left each rod (rod-axis reading, ISO 8429). */
  readings: PerEye<number>
  words: PatientWords
}
