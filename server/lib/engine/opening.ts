// What the patient says on sitting down. Words never name the condition or a
// side; whether they mention a tilt follows the published awareness rates.

import { pick } from '#shared/engine/random'
import type { Rng } from '#shared/engine/random'
import type { Condition } from './types'
import type { CaseDraft } from './families'

/**
 * Share of patients who notice a tilt at a given torsion: 55% at 5°, 86% at 10°,
 * all at 15° (Arch Ophthalmol 1984;102:717-20); straight lines between the points.
 */
export function tiltAwareness(torsion: number): number {
  const t = Math.abs(torsion)
  const pts: Array<[number, number]> = [[0, 0], [5, 0.55], [10, 0.86], [15, 1]]
  for (let i = 1; i < pts.length; i++) {
    const [t1, p1] = pts[i - 1]!
    const [t2, p2] = pts[i]!
    if (t <= t2) return p1 + ((t - t1) / (t2 - t1)) * (p2 - p1)
  }
  return 1
}

const DOUBLE = [
  'I\'ve been seeing double — one picture sits above the other.',
  'Things look doubled, with the second image higher than the first.',
  'I get double vision, one image on top of the other.',
]
const READING = ['It\'s worst when I look down to read.', 'Reading and going down stairs are the hardest.']
const TILT = ['The second picture looks tilted, too.', 'Things look slanted, like a picture hanging crooked.']
const QUIET = [
  'I\'m here for a check-up; I haven\'t noticed anything wrong with my eyes.',
  'Nothing bothers me much — my optometrist asked for a full check.',
]
const SINCE_CHILDHOOD = [
  'One eye has turned since I was small, but I don\'t see double.',
  'I\'ve had a turn in one eye since childhood; I only ever see one of everything.',
]
const HEAD_POSTURE = [
  'People tell me I have held my head on one side in photos for years.',
  'My head has leant to one side for years, as far back as I can remember; the doubling is newer.',
]
const SUDDEN = ['It came on suddenly, with some dizziness.', 'I felt unsteady on my feet when the double vision began.']
const GRITTY = ['My eyes feel gritty and look more prominent than they used to.', 'My eyes have felt sore and look a bit staring lately.']

export function openingWords(rng: Rng, d: CaseDraft, condition: Condition): string {
  const v0 = Math.abs(d.vertical.gazes.primary)
  const vDown = Math.abs(d.vertical.gazes.down)
  const maxReported = Math.max(Math.abs(d.reported.primary.RE), Math.abs(d.reported.primary.LE))
  const parts: string[] = []
  // drawInRange every choice in the same order whatever the case, so words stay stable per seed
  const r = { double: pick(rng, DOUBLE), reading: pick(rng, READING), tilt: pick(rng, TILT), quiet: pick(rng, QUIET),
    child: pick(rng, SINCE_CHILDHOOD), posture: pick(rng, HEAD_POSTURE), sudden: pick(rng, SUDDEN), gritty: pick(rng, GRITTY),
    aware: rng() }
  if (condition === 'suppression') return r.child
  if (condition === 'long-standing-so-palsy') parts.push(r.posture)
  if (v0 >= 2) parts.push(r.double)
  else if (!d.acquired || maxReported < 2) parts.push(r.quiet)
  if (v0 >= 2 && vDown > v0 * 1.15) parts.push(r.reading)
  if (d.acquired && r.aware < tiltAwareness(maxReported)) parts.push(r.tilt)
  if (condition === 'skew-deviation') parts.push(r.sudden)
  if (condition === 'ted-ir-restriction') parts.push(r.gritty)
  if (parts.length === 0) parts.push(r.quiet)
  return parts.join(' ')
}
