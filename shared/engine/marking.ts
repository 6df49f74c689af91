// Marking rules shared by the grader, quizzes, slip patterns and the screens that
// show marks (domain.md §5.2): the no-torsion band and the cap of critical slips.

import type { Slip, SlipCode } from './slips'
import type { Eye } from './types'

/**
 * Below this many degrees an eye has no torsion worth a direction: "no torsion", or
 * any amount within the tolerance of zero, is right for it. From this size up the
 * torsion has a direction, and naming the opposite one is `direction-reversed`
 * however wide the amount tolerance. (Common practice: the double Maddox rod repeats
 * to within about 1–2°; a sign error changes the diagnosis, a 1° difference does not.)
 */
export const NO_TORSION_BELOW = 1

/** Whether a signed torsion (degrees, positive = excyclo) has a direction worth recording. */
export const hasDirection = (t: number): boolean => Math.abs(t) >= NO_TORSION_BELOW

/** Slips that would mislead the next clinician who reads the notes. */
export const CRITICAL_SLIPS = ['eye-wrong', 'direction-reversed', 'dial-value-as-amount', 'should-not-test'] as const satisfies readonly SlipCode[]
export type CriticalSlip = (typeof CRITICAL_SLIPS)[number]

/** A record with a critical slip scores at most this fraction of its points. */
export const CRITICAL_CAP = 0.5

export const isCriticalSlip = (code: string): code is CriticalSlip => (CRITICAL_SLIPS as readonly string[]).includes(code)

/**
 * The criterion each critical slip costs. A tutor who overrides that criterion to full
 * marks (with a reason) has judged the slip not to stand, and the cap lifts with it.
 */
export const CRITICAL_CRITERION: Record<CriticalSlip, string> = {
  'eye-wrong': 'eye',
  'direction-reversed': 'direction',
  'dial-value-as-amount': 'amount',
  'should-not-test': 'action',
}

export interface MarkCap {
  /** The fraction of the points the record may score at most. */
  limit: number
  /** The critical slips that set the cap, each once. */
  slips: CriticalSlip[]
  /** Points the marks add up to before the cap. */
  uncapped: number
}

export interface CappedPoints {
  earned: number
  possible: number
  cap: MarkCap | null
}

interface PointMark { criterion: string, score: number, weight: number }

/**
 * Points of a set of marks with the critical-slip cap applied: the criteria and their
 * weights count as usual, and the total is then held to at most half the points.
 */
export function cappedPoints(marks: readonly PointMark[], slips: readonly { code: string }[]): CappedPoints {
  const possible = marks.reduce((a, m) => a + m.weight, 0)
  const uncapped = marks.reduce((a, m) => a + m.weight * m.score, 0)
  const standing = [...new Set(slips.map(s => s.code).filter(isCriticalSlip))].filter((code) => {
    const m = marks.find(x => x.criterion === CRITICAL_CRITERION[code])
    return !m || m.score < 1
  })
  if (standing.length === 0) return { earned: uncapped, possible, cap: null }
  const limit = CRITICAL_CAP * possible
  return { earned: Math.min(uncapped, limit), possible, cap: { limit: CRITICAL_CAP, slips: standing, uncapped } }
}

/** The opening words of feedback on a record with a critical slip. */
export const MISLEADING_LEAD = 'This record would mislead the next clinician'

const eyeName = (e: Eye): string => (e === 'RE' ? 'right eye' : 'left eye')

/** What one critical slip does to the next clinician, in plain words ('' for other slips). */
export function misleadingWords(s: Pick<Slip, 'code' | 'eye'>): string {
  const eye = s.eye ? eyeName(s.eye) : 'eye'
  switch (s.code) {
    case 'eye-wrong':
      return s.eye ? `the ${eye}'s torsion is written against the ${eyeName(s.eye === 'RE' ? 'LE' : 'RE')}` : 'the torsion is written against the wrong eye'
    case 'direction-reversed':
      return `the ${eye}'s torsion is given in the opposite direction`
    case 'dial-value-as-amount':
      return `the ${eye}'s amount is the figure on the dial, not the change from 90°`
    case 'should-not-test':
      return 'it records a measurement on a patient who cannot see both lines and should not have been tested'
    default:
      return ''
  }
}

/** "This record would mislead the next clinician: …", or null when no slip is critical. */
export function misleadingLine(slips: readonly Pick<Slip, 'code' | 'eye'>[]): string | null {
  const words = [...new Set(slips.filter(s => isCriticalSlip(s.code)).map(misleadingWords))]
  return words.length ? `${MISLEADING_LEAD}: ${words.join('; ')}.` : null
}

/** One line for the marks table: why the total stops at half. */
export function capNote(cap: MarkCap): string {
  return `Capped at ${Math.round(cap.limit * 100)} % of the points: a record with a critical slip would mislead the next clinician (${Math.round(cap.uncapped * 100) / 100} points before the cap).`
}
