// How the demo students write their records: a few habits, each one a slip
// students really make (domain.md §5.3), so the demo results show realistic marks.
// Invented demo behaviour only; nothing here is a check value.
import type { Gaze, PerEye } from '../../shared/engine/types'

export type Habit = 'careful' | 'image-not-eye' | 'dial-figure' | 'terse' | 'misreads-scale' | 'other-eye'

/** One habit per student, in roster order; the careful habit comes round most often. */
export const HABITS: Habit[] = ['careful', 'image-not-eye', 'careful', 'dial-figure', 'terse', 'misreads-scale', 'careful', 'other-eye']

const GAZE_WORDS: Partial<Record<Gaze, string>> = { primary: 'primary position', down: 'downgaze' }

function eyeText(eye: 'RE' | 'LE', t: number, reverse: boolean, dialFigure: boolean): string {
  const a = Math.round(Math.abs(t))
  if (a === 0) return `${eye} no torsion`
  const ex = (t > 0) !== reverse
  const amount = dialFigure ? Math.round(eye === 'RE' ? 90 + t : 90 - t) : a
  return `${eye} ${amount}° ${ex ? 'excyclotorsion' : 'incyclotorsion'}`
}

/** The record a student with this habit writes for the torsion they found. */
export function demoRecord(found: PerEye<number>, gaze: Gaze, habit: Habit): string {
  const bigger: 'RE' | 'LE' = Math.abs(found.RE) >= Math.abs(found.LE) ? 'RE' : 'LE'
  const shown = habit === 'other-eye' ? { RE: found.LE, LE: found.RE } : found
  const eye = (e: 'RE' | 'LE') => eyeText(e, shown[e], habit === 'image-not-eye' && e === bigger, habit === 'dial-figure' && e === bigger)
  if (habit === 'terse') return `${eye('RE')}, ${eye('LE')}`.replace(/torsion/g, '').replace(/cyclo/g, 'cyclo ')
  return `DMR, near, ${GAZE_WORDS[gaze] ?? gaze}: ${eye('RE')}, ${eye('LE')}.`
}

/** The dial readings a student with this habit takes (misreading by 3° for one habit). */
export function demoReadings(level: PerEye<number>, habit: Habit): PerEye<number> {
  const off = habit === 'misreads-scale' ? 3 : 0
  return { RE: Math.round(level.RE) + off, LE: Math.round(level.LE) - off }
}

/** The torsion a student believes they found: from their own readings by the dial rule. */
export function foundFrom(readings: PerEye<number>): PerEye<number> {
  return { RE: readings.RE - 90, LE: 90 - readings.LE }
}
