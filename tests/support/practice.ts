// Helpers for tests that practise on cases: a hand-written correct record for a
// generated case (written here from the case's numbers, not by the engine's model
// record), and the submission that goes with it.
import type { Gaze } from '#shared/engine/types'
import type { Case } from '~~/server/lib/engine/types'
import { generateCase } from '~~/server/lib/engine/generator'

const GAZE_WORDS: Partial<Record<Gaze, string>> = { primary: 'primary position', down: 'downgaze', up: 'upgaze' }

/** "DMR, near, primary position: RE 6° excyclotorsion, LE no torsion" from the case's own numbers. */
export function correctRecord(c: Case, gaze: Gaze = 'primary', distance: 'near' | 'distance' = 'near'): string {
  const eye = (e: 'RE' | 'LE') => {
    const t = c.gazes[gaze].reported[e]
    const a = Math.round(Math.abs(t))
    return a === 0 ? `${e} no torsion` : `${e} ${a}° ${t > 0 ? 'excyclotorsion' : 'incyclotorsion'}`
  }
  return `DMR, ${distance}, ${GAZE_WORDS[gaze]}: ${eye('RE')}, ${eye('LE')}`
}

export const patientOf = (templateId: string, seed: string): Case => generateCase(templateId, seed)
