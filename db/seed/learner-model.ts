// Simulated learners for the demo histories and the review benchmark: each has
// a recording habit (a profile) and writes a record for a case the way such a
// learner would. The records are then graded by the real grader, so the slips
// stored are the grader's, not invented. Invented behaviour: demo only.
import { readingToTorsion } from '#shared/engine/dial'
import type { Rng } from '#shared/engine/random'
import { normal, pick } from '#shared/engine/random'
import type { Eye, Gaze, PerEye } from '#shared/engine/types'
import { EYES } from '#shared/engine/types'
import { levelReadings } from '~~/server/lib/engine/patient'
import { CASE_TEMPLATES } from '~~/server/lib/engine/templates'
import type { Case } from '~~/server/lib/engine/types'

export const PROFILES = ['clean', 'mostly-clean', 'image', 'swap-LE', 'swap-RE', 'dial', 'unnamed', 'measures-badly'] as const
export type Profile = (typeof PROFILES)[number]

/** Templates a simulated learner is given: ones the double Maddox rod can be recorded on. */
export const SIMULATION_TEMPLATES = CASE_TEMPLATES
  .filter(t => !['suppression', 'long-standing-so-palsy'].includes(t.condition))
  .map(t => t.id)

export interface SimulatedInput {
  gaze: Gaze
  distance: 'near'
  readings: PerEye<number>
  record: string
}

const GAZES: Gaze[] = ['primary', 'primary', 'primary', 'down']
const GAZE_WORDS: Partial<Record<Gaze, string>> = { primary: 'primary position', down: 'downgaze' }

function eyeEntry(eye: Eye, torsion: number, reading: number, profile: Profile, rng: Rng): string {
  const amount = Math.round(Math.abs(torsion))
  if (amount < 1) return `${eye} no torsion`
  let shown = torsion
  if (profile === 'image' || (profile === `swap-${eye}`)) shown = -torsion
  const direction = shown > 0 ? 'excyclotorsion' : 'incyclotorsion'
  const written = profile === 'dial' ? Math.round(reading) : profile === 'mostly-clean' && rng() < 0.06 ? amount + 4 : amount
  return `${eye} ${written}° ${direction}`
}

/** One attempt by a learner with this habit: dial readings set (with their error) and the record written from them. */
export function simulateAttempt(c: Case, profile: Profile, rng: Rng): SimulatedInput {
  const gaze = pick(rng, GAZES)
  const level = levelReadings(c, gaze, [])
  const spread = profile === 'measures-badly' ? 5 : 0.6
  const readings = {
    RE: Math.round(level.RE + normal(rng, 0, spread)),
    LE: Math.round(level.LE + normal(rng, 0, spread)),
  }
  const entries = EYES.map(eye => eyeEntry(eye, readingToTorsion(eye, readings[eye]), readings[eye], profile, rng))
  const named = !(profile === 'unnamed' && rng() < 0.8) && !(profile === 'mostly-clean' && rng() < 0.08)
  const record = `${named ? 'DMR, ' : ''}near, ${GAZE_WORDS[gaze]}: ${entries.join(', ')}.`
  return { gaze, distance: 'near', readings, record }
}
