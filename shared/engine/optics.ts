// What the streaks look like to the patient (domain.md §3.5–3.6). All angles in
// degrees; positions in prism dioptres (Δ) in the PATIENT'S view: x to the
// patient's right, y up, angles counter-clockwise as the patient sees them.

import { normaliseAxis, wrapAxisDifference } from './dial'
import type { Eye, Lights, Offset, PerEye, Prism } from './types'

/** Streak angle of a rod at dial reading `a`, in the patient's view: s = 90 − a. */
export function streakAngle(reading: number): number {
  return wrapAxisDifference(90 - reading)
}

/**
 * Perceived streak angle for an eye with signed torsion `t`:
 * RE p = (90 − a) + t, LE p = (90 − a) − t. Zero = looks horizontal.
 */
export function perceivedStreakAngle(eye: Eye, reading: number, torsion: number): number {
  return wrapAxisDifference(streakAngle(reading) + (eye === 'RE' ? torsion : -torsion))
}

/**
 * Share of the patient's judgement that follows the room rather than the retina
 * when the room lights are on. Dimming is done to remove orientation cues
 * (clinical-facts §3.1); the size of the pull is Cyclodial's own model choice.
 */
export const LIGHTS_ON_FRAME_WEIGHT = 0.5

/**
 * Perceived angle from the reading at which the streak looks horizontal in a dim
 * room (`horizontalAt`): p = h − a for either eye, pulled toward the streak's real
 * angle when the lights are on.
 */
export function perceivedFromHorizontalAt(horizontalAt: number, reading: number, lights: Lights = 'dim'): number {
  const dim = wrapAxisDifference(horizontalAt - reading)
  if (lights === 'dim') return dim
  return wrapAxisDifference((1 - LIGHTS_ON_FRAME_WEIGHT) * dim + LIGHTS_ON_FRAME_WEIGHT * streakAngle(reading))
}

/** The reading at which the streak looks horizontal under the given lights. */
export function settingForLevel(horizontalAt: number, lights: Lights = 'dim'): number {
  if (lights === 'dim') return horizontalAt
  // solve (1−w)(h − a) + w(90 − a) = 0 on the short way round the dial
  const h = 90 + wrapAxisDifference(horizontalAt - 90)
  return (1 - LIGHTS_ON_FRAME_WEIGHT) * h + LIGHTS_ON_FRAME_WEIGHT * 90
}

export const isLevel = (perceived: number, threshold: number): boolean => Math.abs(perceived) < threshold

export const looksParallel = (pRE: number, pLE: number, threshold: number): boolean =>
  Math.abs(wrapAxisDifference(pRE - pLE)) < threshold

/** Total excyclodeviation: both eyes' excyclo counted positive (common practice; domain §3.5). */
export const totalTorsion = (t: PerEye<number>): number => t.RE + t.LE

// ---- prisms ----------------------------------------------------------------

/** Prism dioptres → degrees of deviation: angle = atan(P/100) (Prentice's definition). */
export const prismDioptresToDegrees = (power: number): number => (Math.atan(power / 100) * 180) / Math.PI

/** Degrees → prism dioptres: P = 100·tan(angle). */
export const degreesToPrismDioptres = (degrees: number): number => 100 * Math.tan((degrees * Math.PI) / 180)

/** Displacement (cm) of a ray at a given distance (m) by a prism of P Δ. */
export const prismDisplacementCm = (power: number, distanceM: number): number => power * distanceM

/**
 * Shift of the image seen through a prism, in the patient's view. The image moves
 * toward the apex: base down → up; base in → apex out → toward that eye's temple.
 */
export function prismImageShift(prism: Prism): Offset {
  const p = Math.abs(prism.power)
  switch (prism.base) {
    case 'down':
      return { x: 0, y: p }
    case 'up':
      return { x: 0, y: -p }
    case 'in':
      // temple of the RE is the patient's right
      return { x: prism.eye === 'RE' ? p : -p, y: 0 }
    case 'out':
      return { x: prism.eye === 'RE' ? -p : p, y: 0 }
  }
}

const sumShift = (prisms: readonly Prism[], eye: Eye): Offset =>
  prisms
    .filter(p => p.eye === eye)
    .map(prismImageShift)
    .reduce((a, b) => ({ x: a.x + b.x, y: a.y + b.y }), { x: 0, y: 0 })

/**
 * A deviation between the eyes in Δ: vertical positive = right eye higher (R/L),
 * horizontal positive = eso, negative = exo.
 */
export interface Deviation {
  vertical: number
  horizontal: number
}

/**
 * Where each eye's streak appears. A right hypertropia puts the RE streak LOWER;
 * an esotropia puts the RE streak to the patient's right (uncrossed). The fixing
 * eye's streak stays at the centre and the other one carries the separation.
 */
export function streakOffsets(deviation: Deviation, prisms: readonly Prism[], fixingEye: Eye): PerEye<Offset> {
  const re = sumShift(prisms, 'RE')
  const le = sumShift(prisms, 'LE')
  // separation of the RE streak relative to the LE streak
  const rel: Offset = {
    x: deviation.horizontal + re.x - le.x,
    y: -deviation.vertical + re.y - le.y,
  }
  const zero: Offset = { x: 0, y: 0 }
  return fixingEye === 'RE'
    ? { RE: zero, LE: { x: -rel.x, y: -rel.y } }
    : { RE: rel, LE: zero }
}

/**
 * Half-size of the field in which a streak can be seen, in Δ. A long horizontal
 * streak stays visible over a wide horizontal range; the vertical range is what
 * usually runs out. Cyclodial's model choice, not a published figure.
 */
export const VISIBLE_FIELD: Offset = { x: 40, y: 20 }

export const inView = (o: Offset): boolean => Math.abs(o.x) <= VISIBLE_FIELD.x && Math.abs(o.y) <= VISIBLE_FIELD.y

/** Vertical separation below which the two streaks are hard to tell apart (common practice). */
export const OVERLAP_BELOW = 2

export const streaksOverlap = (o: PerEye<Offset>): boolean => Math.abs(o.RE.y - o.LE.y) < OVERLAP_BELOW

// ---- artefact of the separating prism --------------------------------------

/**
 * Apparent excyclotorsion (total, degrees) that a vertical prism adds in normal
 * subjects: Marsh et al., Am Orthopt J 2014;64:76-80 — 0.95, 1.6, 1.9, 2.1, 2.2° at
 * 3, 10, 16, 20, 30 Δ, rising roughly logarithmically.
 */
export const PRISM_ARTEFACT_POINTS: ReadonlyArray<readonly [number, number]> = [
  [3, 0.95],
  [10, 1.6],
  [16, 1.9],
  [20, 2.1],
  [30, 2.2],
]

/** Interpolate the artefact on log(power); linear to zero below 3 Δ, flat above 30 Δ. */
export function prismInducedExcyclo(verticalPower: number): number {
  const p = Math.abs(verticalPower)
  const pts = PRISM_ARTEFACT_POINTS
  const first = pts[0]!
  const last = pts[pts.length - 1]!
  if (p === 0) return 0
  if (p <= first[0]) return (first[1] * p) / first[0]
  if (p >= last[0]) return last[1]
  for (let i = 1; i < pts.length; i++) {
    const [p1, d1] = pts[i - 1]!
    const [p2, d2] = pts[i]!
    if (p <= p2) {
      const f = (Math.log(p) - Math.log(p1)) / (Math.log(p2) - Math.log(p1))
      return d1 + f * (d2 - d1)
    }
  }
  return last[1]
}

/** Net vertical prism between the eyes, in Δ (what separates the streaks). */
export function netVerticalPrism(prisms: readonly Prism[]): number {
  return Math.abs(sumShift(prisms, 'RE').y - sumShift(prisms, 'LE').y)
}

/**
 * The reading at which an eye's streak looks horizontal once the separating
 * prism's artefact is added. The artefact is a total excyclo; Cyclodial splits it
 * equally between the eyes (model choice: the source reports only the total).
 */
export function effectiveHorizontalAt(eye: Eye, horizontalAt: number, prisms: readonly Prism[]): number {
  const half = prismInducedExcyclo(netVerticalPrism(prisms)) / 2
  if (half === 0) return horizontalAt
  return normaliseAxis(horizontalAt + (eye === 'RE' ? half : -half))
}
