// Trial-frame dial geometry (ISO 8429:1986) and the reading ↔ torsion rule
// (domain.md §3.1, §3.4). Cyclodial's dial index marks the ROD (cylinder) AXIS,
// which reads 90° when an eye has no torsion.

import type { Eye } from './types'

/** Reading of the rod axis when the eye has no torsion. */
export const ZERO_TORSION_READING = 90

/** Normalise an axis to the half-open range [0, 180): an axis and its opposite are the same line. */
export function normaliseAxis(angle: number): number {
  const r = angle % 180
  const n = r < 0 ? r + 180 : r
  // -0 and 180 both mean the horizontal
  return n === 0 ? 0 : n
}

/** Wrap a signed angle difference of axes into (-90, 90]. */
export function wrapAxisDifference(angle: number): number {
  const n = normaliseAxis(angle)
  return n > 90 ? n - 180 : n
}

/**
 * Signed torsion (positive = excyclo) that a rod-axis reading shows when the
 * patient says the eye's streak looks horizontal.
 * RE: t = a − 90; LE: t = 90 − a (the same scale serves both eyes, seen from in front).
 */
export function readingToTorsion(eye: Eye, reading: number): number {
  const fromVertical = wrapAxisDifference(reading - ZERO_TORSION_READING)
  return eye === 'RE' ? fromVertical : -fromVertical
}

/** The rod-axis reading at which an eye with signed torsion `t` sees its streak horizontal. */
export function torsionToReading(eye: Eye, torsion: number): number {
  return normaliseAxis(ZERO_TORSION_READING + (eye === 'RE' ? torsion : -torsion))
}

/**
 * Direction of a dial angle as the EXAMINER sees it (ISO 8429: 0° at the examiner's
 * right, counter-clockwise): a unit vector with x to the examiner's right, y up.
 */
export function dialDirectionExaminerView(angle: number): { x: number, y: number } {
  const rad = (angle * Math.PI) / 180
  return { x: Math.cos(rad), y: Math.sin(rad) }
}

/** The same axis in the patient's own view (their left and right are swapped). */
export function dialAngleInPatientView(angle: number): number {
  return normaliseAxis(180 - angle)
}

/**
 * Which side of the given eye the 0° end of the scale points to. The examiner's
 * right is the patient's left, so 0° is nasal for the RE and temporal for the LE.
 */
export function zeroEndSide(eye: Eye): 'nasal' | 'temporal' {
  return eye === 'RE' ? 'nasal' : 'temporal'
}

/**
 * Where the upper end of the rod axis leans for a reading: toward the nose, toward
 * the temple (ear), or straight up. Upper end toward the ear = excyclo for either eye.
 */
export function rodTopLeans(eye: Eye, reading: number): 'nasal' | 'temporal' | 'vertical' {
  const d = wrapAxisDifference(reading - ZERO_TORSION_READING)
  if (d === 0) return 'vertical'
  // reading above 90 tilts the top toward the examiner's left = patient's right
  const towardPatientsRight = d > 0
  const patientsRightIsTemporal = eye === 'RE'
  return towardPatientsRight === patientsRightIsTemporal ? 'temporal' : 'nasal'
}

/**
 * Some rods are marked along the streak instead (0/180 at zero torsion). Convert a
 * rod-axis reading to that convention, for explaining the difference to learners.
 */
export function rodAxisToStreakMark(reading: number): number {
  return normaliseAxis(reading + 90)
}

/** Mirror a reading between eyes: the mirror image of axis a is axis 180 − a. */
export function mirrorReading(reading: number): number {
  return normaliseAxis(180 - reading)
}
