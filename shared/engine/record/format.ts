// The "read as" line shown under the record pad: how Cyclodial read the record.

import type { Gaze } from '../types'
import type { EyeRecord, GazeSection, NotPerformedReason, ParsedRecord, TestName } from './types'

const TEST_LABEL: Record<TestName, string> = {
  'double-maddox-rod': 'double Maddox rod',
  'single-maddox-rod': 'single Maddox rod',
  'maddox-rod': 'Maddox rod (single or double not stated)',
}

export const GAZE_LABEL: Record<Gaze, string> = {
  'primary': 'Primary',
  'up': 'Upgaze',
  'down': 'Downgaze',
  'right': 'Right gaze',
  'left': 'Left gaze',
  'up-right': 'Up and right',
  'up-left': 'Up and left',
  'down-right': 'Down and right',
  'down-left': 'Down and left',
}

const REASON_LABEL: Record<NotPerformedReason, string> = {
  'suppression': 'suppression',
  'one-streak': 'sees one streak only',
  'abnormal-correspondence': 'abnormal retinal correspondence',
  'unstated': 'reason not stated',
}

const fmtNumber = (n: number): string => (Number.isInteger(n) ? String(n) : n.toFixed(1))

export function formatEyeRecord(r: EyeRecord): string {
  if (r.direction === 'none') return 'no torsion'
  const amount = r.amount === null ? 'amount not stated' : `${fmtNumber(r.amount)}°`
  const dir = r.direction === null ? 'direction not stated' : r.direction
  return `${amount} ${dir}`
}

export function gazeLabel(s: Pick<GazeSection, 'gaze' | 'gazeDegrees'>): string {
  if (s.gaze === null) return 'Position of gaze: not stated'
  const label = GAZE_LABEL[s.gaze]
  return s.gazeDegrees !== undefined ? `${s.gazeDegrees}° ${label.toLowerCase()}` : label
}

function sectionParts(s: GazeSection): string[] {
  const parts: string[] = []
  if (s.eyes.RE) parts.push(`RE ${formatEyeRecord(s.eyes.RE)}`)
  if (s.eyes.LE) parts.push(`LE ${formatEyeRecord(s.eyes.LE)}`)
  if (s.total) parts.push(`Total ${formatEyeRecord(s.total)}`)
  if (parts.length === 0) parts.push('Eye: not stated')
  return parts
}

/** "Test: double Maddox rod · Near · Primary · RE 8° excyclo · LE no torsion" */
export function readAsLine(r: ParsedRecord): string {
  const head = [
    `Test: ${r.test ? TEST_LABEL[r.test] : 'not named'}`,
    r.distance === 'near' ? 'Near' : r.distance === 'distance' ? 'Distance' : 'Fixation distance: not stated',
  ]
  if (r.notPerformed) {
    return [...head, `Not performed: ${r.notPerformed.reasons.map(x => REASON_LABEL[x]).join(', ')}`].join(' · ')
  }
  const spelling = (r.spelling ?? []).map(c => `Misspelling read: "${c.written}" as "${c.readAs}"`)
  if (r.sections.length === 1) {
    const s = r.sections[0]!
    return [...head, gazeLabel(s), ...sectionParts(s), ...spelling].join(' · ')
  }
  return [...head, ...r.sections.map(s => `${gazeLabel(s)}: ${sectionParts(s).join(', ')}`), ...spelling].join(' · ')
}
