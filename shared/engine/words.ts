// The patient's words, worked out from what the patient sees (a PatientView).
// Pure and seeded: the same view always gives the same words, so the bench can
// re-run this on every dial movement without the words flickering.

import { wrapAxisDifference } from './dial'
import { isLevel } from './optics'
import { makeRng, pick } from './random'
import type { Rng } from './random'
import type { Eye, Observation, PatientWords, SlopeSize } from './types'
import { EYES, otherEye } from './types'
import type { PatientView, SeenStreak } from './view'

// The words' types live in types.ts (presentation.ts needs them without words.ts).
export type { Observation, PatientWords, SlopeSize } from './types'

/** Tilt sizes a patient would put into words; Cyclodial's own bands. */
export function slopeSize(angle: number): SlopeSize {
  const a = Math.abs(angle)
  if (a < 4) return 'slight'
  if (a < 10) return 'clear'
  return 'steep'
}

/**
 * Which end of a streak is lower, in the patient's view, and whether that is
 * toward the nose or the ear of the eye that sees it. A counter-clockwise streak
 * (positive angle) has its left end lower; the RE's nose is on the patient's left.
 */
export function slopeOf(eye: Eye, perceived: number): { lowEnd: 'left' | 'right', towards: 'nose' | 'ear' } {
  const lowEnd = perceived > 0 ? 'left' : 'right'
  const noseSide = eye === 'RE' ? 'left' : 'right'
  return { lowEnd, towards: lowEnd === noseSide ? 'nose' : 'ear' }
}

const colourName = (s: SeenStreak): string => `the ${s.colour} line`
const capital = (t: string): string => t.charAt(0).toUpperCase() + t.slice(1)

function observe(view: PatientView, rng: Rng): Observation[] {
  const out: Observation[] = []
  const { threshold, reliability } = view.response
  const coarse = reliability === 'coarse'
  if (view.lights === 'on') out.push({ kind: 'lights-on' })

  const visible = EYES.filter(e => view.streaks[e].visible)
  if (visible.length === 0) {
    out.push({ kind: 'none-seen' })
    return out
  }
  if (visible.length === 1) {
    const seen = visible[0]!
    const hidden = otherEye(seen)
    out.push(
      view.streaks[hidden].suppressed ? { kind: 'one-line', seen } : { kind: 'out-of-view', eye: hidden },
    )
    out.push(describeOne(view, seen, rng))
    return out
  }

  const rel = wrapAxisDifference(view.streaks.RE.perceivedAngle - view.streaks.LE.perceivedAngle)
  const bothLevel = EYES.every(e => isLevel(view.streaks[e].perceivedAngle, threshold))
  // two lines that each look level are called parallel, whatever the small sum of their tilts
  const parallel = bothLevel || Math.abs(rel) < threshold
  if (view.overlap) {
    out.push({ kind: 'overlap', crossing: !parallel })
    return out
  }
  for (const eye of EYES) out.push(describeOne(view, eye, rng))
  // coarse patients hedge when the two lines are close to parallel
  if (coarse && !parallel && Math.abs(rel) < 2 * threshold && rng() < 0.5) {
    out.push({ kind: 'unsure' })
  }
  else if (parallel) {
    out.push({ kind: 'parallel', level: bothLevel })
  }
  else {
    out.push({ kind: 'not-parallel' })
  }
  return out
}

function describeOne(view: PatientView, eye: Eye, rng: Rng): Observation {
  const p = view.streaks[eye].perceivedAngle
  const { threshold, reliability } = view.response
  if (isLevel(p, threshold)) return { kind: 'level', eye }
  if (reliability === 'coarse' && Math.abs(p) < 2 * threshold && rng() < 0.4) return { kind: 'unsure', eye }
  return { kind: 'slopes', eye, ...slopeOf(eye, p), size: slopeSize(p) }
}

const SIZE_WORD: Record<SlopeSize, string> = { slight: 'slightly ', clear: '', steep: 'steeply ' }

function say(o: Observation, view: PatientView, coarse: boolean, rng: Rng): string {
  const name = (e: Eye) => colourName(view.streaks[e])
  switch (o.kind) {
    case 'lights-on':
      return 'With the room lights on it\'s hard to pick the lines out.'
    case 'none-seen':
      return 'I can\'t see any lines at all.'
    case 'one-line':
      return `I can only see one line — ${name(o.seen)}.`
    case 'out-of-view':
      return `I can't see ${name(o.eye)}.`
    case 'overlap':
      return o.crossing
        ? 'The lines are on top of each other — they cross in the middle.'
        : 'The lines are on top of each other; I can\'t tell them apart.'
    case 'level':
      return coarse
        ? pick(rng, [`${capital(name(o.eye))} looks straight.`, `${capital(name(o.eye))} seems flat enough.`])
        : `${capital(name(o.eye))} looks level.`
    case 'slopes':
      if (coarse && rng() < 0.35) {
        return pick(rng, [
          `${capital(name(o.eye))} is a bit tilted.`,
          `${capital(name(o.eye))} looks wonky.`,
          `${capital(name(o.eye))} isn't straight.`,
        ])
      }
      return `${capital(name(o.eye))} slopes ${SIZE_WORD[o.size]}down to my ${o.lowEnd}, towards my ${o.towards}.`
    case 'parallel':
      return o.level ? 'They both look level — parallel now.' : 'They look parallel to each other now.'
    case 'not-parallel':
      return coarse ? pick(rng, ['They\'re not quite the same.', 'They don\'t match.']) : 'They aren\'t parallel.'
    case 'unsure':
      return o.eye
        ? `I think ${name(o.eye)} is level… I'm not sure.`
        : pick(rng, ['They look about the same, I think.', 'I\'m not sure — nearly?'])
  }
}

/** The patient's words for a view. */
export function describeView(view: PatientView): PatientWords {
  const rng = makeRng(`${view.wordsKey}|words`)
  const observations = observe(view, rng)
  const coarse = view.response.reliability === 'coarse'
  const text = observations.map(o => say(o, view, coarse, rng)).join(' ')
  return { text, observations }
}
