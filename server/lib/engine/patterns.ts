// Building blocks of a case: how vertical deviation and torsion vary with the
// position of gaze and head tilt for a weak muscle, and a normal eye's torsion.

import { HEALTHY_SUBJECTIVE_TORSION } from '#shared/engine/fundus/normals'
import { clamp, normal, uniform } from '#shared/engine/random'
import type { Rng } from '#shared/engine/random'
import type { Gaze, Muscle, Side } from '#shared/engine/types'
import { GAZES } from '#shared/engine/types'
import type { NumberRange } from './templates'
import {
  MUSCLE_ACTIONS,
  GAZE_VECTOR,
  horizontalForField,
  hyperEyeWhenWeak,
  muscleEye,
  muscleName,
  tiltThatLoads,
  torsionSignWhenWeak,
} from './muscles'

export const drawInRange = (rng: Rng, r: NumberRange): number => uniform(rng, r[0], r[1])

export type GazeNumbers = Record<Gaze, number>
export const byGaze = (f: (g: Gaze) => number): GazeNumbers =>
  Object.fromEntries(GAZES.map(g => [g, f(g)])) as GazeNumbers

/**
 * Torsion of an eye in the normal range: about 1° excyclo (Flodin et al., Acta
 * Ophthalmol 2020), kept within −0.5…2° so "both eyes within about ±2°" holds.
 */
export const normalEyeTorsion = (rng: Rng): number =>
  clamp(normal(rng, 1, 0.4), HEALTHY_SUBJECTIVE_TORSION.low, HEALTHY_SUBJECTIVE_TORSION.high)

/** How strongly a weak muscle's vertical effect varies, drawn once per palsy. */
export interface PalsyShape {
  /** Primary-position vertical deviation, Δ (magnitude). */
  m: number
  /** Gain toward / away from the muscle's horizontal field (0.3–0.6 → right and left gaze clearly differ). */
  kH: number
  /** Gain toward / away from its vertical field (up for elevators, down for depressors). */
  kV: number
  /** Head tilt to the loading side multiplies the deviation by this… */
  tiltWorse: number
  /** …and the other tilt by this. */
  tiltBetter: number
  /** Lying down keeps this share (a palsy changes little: Wong, J AAPOS 2010). */
  supine: number
}

export function drawPalsyShape(rng: Rng, vertical: NumberRange): PalsyShape {
  return {
    m: drawInRange(rng, vertical),
    kH: uniform(rng, 0.3, 0.6),
    kV: uniform(rng, 0.1, 0.3),
    tiltWorse: uniform(rng, 1.5, 2.2),
    tiltBetter: uniform(rng, 0.2, 0.7),
    supine: uniform(rng, 0.75, 1),
  }
}

export interface VerticalPattern {
  gazes: GazeNumbers
  headTilt: Record<Side, number>
  supine: number
}

/** Vertical deviation (Δ, + = right eye higher) produced by one weak muscle. */
export function palsyVertical(muscle: Muscle, s: PalsyShape): VerticalPattern {
  const a = MUSCLE_ACTIONS[muscleName(muscle)]
  const sign = hyperEyeWhenWeak(muscle) === 'RE' ? 1 : -1
  const fieldH = horizontalForField(muscleEye(muscle), a.verticalField)
  const fieldV = a.vertical === 'elevates' ? 1 : -1
  const gazes = byGaze((g) => {
    const { h, v } = GAZE_VECTOR[g]
    return sign * s.m * (1 + s.kH * h * fieldH) * (1 + s.kV * v * fieldV)
  })
  const loads = tiltThatLoads(muscle)
  const headTilt = {
    right: sign * s.m * (loads === 'right' ? s.tiltWorse : s.tiltBetter),
    left: sign * s.m * (loads === 'left' ? s.tiltWorse : s.tiltBetter),
  }
  return { gazes, headTilt, supine: sign * s.m * s.supine }
}

export const addVertical = (a: VerticalPattern, b: VerticalPattern): VerticalPattern => ({
  gazes: byGaze(g => a.gazes[g] + b.gazes[g]),
  headTilt: { right: a.headTilt.right + b.headTilt.right, left: a.headTilt.left + b.headTilt.left },
  supine: a.supine + b.supine,
})

/**
 * Torsion of the eye with the weak muscle in each position: `t0` in primary, more
 * in the muscle's vertical field (SO → downgaze; 3.40° → 4.16°, J Korean Ophthalmol
 * Soc 2016) and a little more where it acts most torsionally.
 */
export function palsyTorsion(muscle: Muscle, t0: number, gainV: number, gainH: number): GazeNumbers {
  const a = MUSCLE_ACTIONS[muscleName(muscle)]
  const sign = torsionSignWhenWeak(muscle)
  const fieldV = a.vertical === 'elevates' ? 1 : -1
  const fieldH = horizontalForField(muscleEye(muscle), a.torsionalField)
  return byGaze((g) => {
    const { h, v } = GAZE_VECTOR[g]
    return sign * t0 * (1 + gainV * v * fieldV) * (1 + gainH * h * fieldH)
  })
}
