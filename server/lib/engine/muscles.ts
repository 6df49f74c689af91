// The cyclovertical muscles' actions (domain.md §7; clinical-facts §6.1) and what
// a palsy of each one does. The generator builds palsies from these actions; the
// three-step table in three-step.ts is written out separately so that tests can
// check one against the other.

import type { Eye, Gaze, Muscle, Side } from '#shared/engine/types'
import { otherEye } from '#shared/engine/types'

export type MuscleName = 'SO' | 'IO' | 'SR' | 'IR'

interface MuscleActions {
  vertical: 'elevates' | 'depresses'
  torsion: 'intorts' | 'extorts'
  /** Where the muscle acts most vertically: obliques in adduction, vertical recti in abduction. */
  verticalField: 'adduction' | 'abduction'
  /** Where it acts most torsionally: the reverse. */
  torsionalField: 'adduction' | 'abduction'
}

export const MUSCLE_ACTIONS: Record<MuscleName, MuscleActions> = {
  SO: { vertical: 'depresses', torsion: 'intorts', verticalField: 'adduction', torsionalField: 'abduction' },
  IO: { vertical: 'elevates', torsion: 'extorts', verticalField: 'adduction', torsionalField: 'abduction' },
  SR: { vertical: 'elevates', torsion: 'intorts', verticalField: 'abduction', torsionalField: 'adduction' },
  IR: { vertical: 'depresses', torsion: 'extorts', verticalField: 'abduction', torsionalField: 'adduction' },
}

export const muscleEye = (m: Muscle): Eye => (m[0] === 'R' ? 'RE' : 'LE')
export const muscleName = (m: Muscle): MuscleName => m.slice(1) as MuscleName
export const muscleId = (eye: Eye, name: MuscleName): Muscle => `${eye[0]}${name}` as Muscle

/** Horizontal gaze component (+1 = patient's right) that puts an eye in adduction or abduction. */
export function horizontalForField(eye: Eye, field: 'adduction' | 'abduction'): 1 | -1 {
  // the right eye adducts when the patient looks to their left
  const adduct = eye === 'RE' ? -1 : 1
  return field === 'adduction' ? adduct : (-adduct as 1 | -1)
}

/** The eye that ends up higher when this muscle is weak. */
export const hyperEyeWhenWeak = (m: Muscle): Eye =>
  MUSCLE_ACTIONS[muscleName(m)].vertical === 'depresses' ? muscleEye(m) : otherEye(muscleEye(m))

/** Sign of the torsion the weak muscle leaves: losing an intorter leaves excyclo (+). */
export const torsionSignWhenWeak = (m: Muscle): 1 | -1 => (MUSCLE_ACTIONS[muscleName(m)].torsion === 'intorts' ? 1 : -1)

/** Head tilt side that asks the muscle to work: the eye on the tilt side intorts, the other extorts. */
export function tiltThatLoads(m: Muscle): Side {
  const eyeSide: Side = muscleEye(m) === 'RE' ? 'right' : 'left'
  const other: Side = eyeSide === 'right' ? 'left' : 'right'
  return MUSCLE_ACTIONS[muscleName(m)].torsion === 'intorts' ? eyeSide : other
}

export const GAZE_VECTOR: Record<Gaze, { h: -1 | 0 | 1, v: -1 | 0 | 1 }> = {
  'primary': { h: 0, v: 0 },
  'up': { h: 0, v: 1 },
  'down': { h: 0, v: -1 },
  'right': { h: 1, v: 0 },
  'left': { h: -1, v: 0 },
  'up-right': { h: 1, v: 1 },
  'up-left': { h: -1, v: 1 },
  'down-right': { h: 1, v: -1 },
  'down-left': { h: -1, v: -1 },
}

export const MIRROR_GAZE: Record<Gaze, Gaze> = {
  'primary': 'primary',
  'up': 'up',
  'down': 'down',
  'right': 'left',
  'left': 'right',
  'up-right': 'up-left',
  'up-left': 'up-right',
  'down-right': 'down-left',
  'down-left': 'down-right',
}

export const mirrorMuscle = (m: Muscle): Muscle => muscleId(otherEye(muscleEye(m)), muscleName(m))
