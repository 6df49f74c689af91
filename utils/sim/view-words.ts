// The patient's view in words, for people who cannot see the canvas: where each
// streak is and how it tilts, as drawn (never a number of the case; tilts in the
// same three sizes the patient uses). SimPatientView announces it, with the
// patient's words, once the view has settled.

import { slopeSize } from '#shared/engine/words'
import type { SlopeSize } from '#shared/engine/words'
import type { Eye } from '#shared/engine/types'
import type { DrawnStreak, DrawnView } from './view-geometry'

/** Below this tilt (degrees) a drawn streak is described as level; Cyclodial's own choice (about what the eye can tell on the canvas). */
export const LEVEL_DRAWN = 0.5

const EYE_WORD: Record<Eye, string> = { RE: 'right eye', LE: 'left eye' }
const SIZE_WORD: Record<SlopeSize, string> = { slight: 'slightly', clear: 'clearly', steep: 'steeply' }

function streakName(s: DrawnStreak): string {
  return `the ${s.colour}${s.pattern === 'dashed' ? ' dashed' : ''} line (${EYE_WORD[s.eye]})`
}

const capital = (t: string): string => t.charAt(0).toUpperCase() + t.slice(1)

/** How one drawn streak lies, e.g. "the red line (right eye) slopes slightly down to the left". */
export function tiltInWords(s: DrawnStreak): string {
  if (!s.visible) return `${streakName(s)} is not in view`
  if (Math.abs(s.angle) < LEVEL_DRAWN) return `${streakName(s)} is level`
  // a positive (anticlockwise) tilt has its left end lower
  return `${streakName(s)} slopes ${SIZE_WORD[slopeSize(s.angle)]} down to the ${s.angle > 0 ? 'left' : 'right'}`
}

/** The whole drawn view in words; '' when nothing is drawn. */
export function drawnViewInWords(view: DrawnView | null): string {
  if (!view) return ''
  const parts: string[] = []
  if (view.source === 'reported') parts.push('Drawn from the patient\'s report.')
  if (view.lights === 'on') parts.push('The room lights are on, so the lines are faint.')
  const { RE, LE } = view.streaks
  if (!RE.visible && !LE.visible) {
    parts.push('No line is in view.')
    return parts.join(' ')
  }
  parts.push(`${capital(tiltInWords(RE))}; ${tiltInWords(LE)}.`)
  if (view.overlap) parts.push('The two lines lie on top of each other.')
  else if (RE.visible && LE.visible && Math.abs(RE.angle - LE.angle) < LEVEL_DRAWN) parts.push('The two lines are parallel.')
  return parts.join(' ')
}
