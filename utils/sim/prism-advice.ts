// What to do when the patient cannot report two separate lines: said beside the
// patient's words, where the learner is looking, not under the prism tray.
import type { DrawnView } from './view-geometry'
import type { PatientView } from '#shared/engine/view'

export const ADVICE_ONE_OUT = 'One line is out of view: a prism before one eye moves its line back into the field (the image moves towards the apex).'
export const ADVICE_OVERLAP = 'The lines lie on top of each other: a vertical prism (commonly 4–10Δ, base up or down) separates them. A strong prism adds a little apparent excyclotorsion of its own.'

export function prismAdvice(drawn: DrawnView | null | undefined, live: PatientView | null | undefined): string | null {
  if (!drawn) return null
  const hidden = (['RE', 'LE'] as const).filter(e => !drawn.streaks[e].visible)
  if (drawn.source === 'live' && hidden.length === 1 && !live?.streaks[hidden[0]!].suppressed) return ADVICE_ONE_OUT
  if (drawn.overlap && hidden.length === 0) return ADVICE_OVERLAP
  return null
}
