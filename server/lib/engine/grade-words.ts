// Wording of marks and feedback. Every reason quotes what the record said, in its
// read-as form, beside the finding; it never puts the finding in the learner's mouth.

import { formatEyeRecord } from '#shared/engine/parser'
import type { EyeRecord } from '#shared/engine/parser'
import { hasDirection } from '#shared/engine/marking'
import type { Eye } from '#shared/engine/types'

export const eyeWords = (e: Eye): string => (e === 'RE' ? 'right eye' : 'left eye')
export const degWords = (v: number): string => `${Math.round(Math.abs(v) * 10) / 10}°`

/** A signed torsion as a clinician would say it; under 1° it is "no torsion". */
export function findingWords(t: number): string {
  if (!hasDirection(t)) return 'no torsion'
  return `${degWords(t)} ${t > 0 ? 'excyclotorsion' : 'incyclotorsion'}`
}

/** "You wrote RE 5° incyclo" — the record's own entry, as read. */
export function wroteWords(label: string, r: EyeRecord | undefined): string {
  if (!r) return `You wrote nothing for the ${label === 'RE' ? 'right eye' : label === 'LE' ? 'left eye' : label.toLowerCase()}`
  return label === '' ? `You wrote ${formatEyeRecord(r)} without an eye` : `You wrote ${label === 'Total' ? 'total' : label} ${formatEyeRecord(r)}`
}

/** "the right eye has 8° excyclotorsion" */
export const hasWords = (e: Eye, t: number): string => `the ${eyeWords(e)} has ${findingWords(t)}`
