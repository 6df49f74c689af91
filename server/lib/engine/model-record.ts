// The model record: how a complete, correct record of the finding reads.
// It is written in words the record parser reads back to the same finding.

import { hasDirection } from '#shared/engine/marking'
import type { Distance, Eye, Gaze, PerEye } from '#shared/engine/types'

const GAZE_WORDS: Record<Gaze, string> = {
  'primary': 'primary position',
  'up': 'upgaze',
  'down': 'downgaze',
  'right': 'right gaze',
  'left': 'left gaze',
  'up-right': 'up and right',
  'up-left': 'up and left',
  'down-right': 'down and right',
  'down-left': 'down and left',
}

/** Amounts are written to whole degrees unless the tolerance is finer than 1°. */
export function roundModelAmount(v: number, tolerance = 2): number {
  return tolerance < 1 ? Math.round(v * 10) / 10 : Math.round(v)
}

/** An eye under 1° is written "no torsion", so the model never contradicts a record that earned full marks. */
export function modelEyeFinding(eye: Eye, torsion: number, tolerance = 2): string {
  const a = roundModelAmount(Math.abs(torsion), tolerance)
  if (!hasDirection(torsion) || a === 0) return `${eye} no torsion`
  return `${eye} ${a}° ${torsion > 0 ? 'excyclotorsion' : 'incyclotorsion'}`
}

export interface ModelRecordInput {
  torsion: PerEye<number>
  gaze: Gaze
  distance?: Distance
  tolerance?: number
}

/** "DMR, near, primary position: RE 8° excyclotorsion, LE no torsion." */
export function modelRecord(m: ModelRecordInput): string {
  const head = ['DMR', ...(m.distance ? [m.distance] : []), GAZE_WORDS[m.gaze]].join(', ')
  return `${head}: ${modelEyeFinding('RE', m.torsion.RE, m.tolerance)}, ${modelEyeFinding('LE', m.torsion.LE, m.tolerance)}.`
}

export const NOT_PERFORMED_RECORD = 'DMR not performed: sees one streak only — suppression.'
