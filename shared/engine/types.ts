// Shared vocabulary of the torsion engine. Browser-safe: nothing here is secret.
// Sign convention used everywhere in Cyclodial: signed torsion in degrees,
// positive = excyclotorsion, negative = incyclotorsion (domain.md §3.3).

export const EYES = ['RE', 'LE'] as const
export type Eye = (typeof EYES)[number]

export const otherEye = (eye: Eye): Eye => (eye === 'RE' ? 'LE' : 'RE')

/** Positions of gaze, named from the patient's side ("right" = the patient looks to their own right). */
export const GAZES = [
  'primary',
  'up',
  'down',
  'right',
  'left',
  'up-right',
  'up-left',
  'down-right',
  'down-left',
] as const
export type Gaze = (typeof GAZES)[number]

export const DISTANCES = ['near', 'distance'] as const
export type Distance = (typeof DISTANCES)[number]

/** Direction of a torsion as written in a record. */
export const DIRECTIONS = ['excyclo', 'incyclo'] as const
export type Direction = (typeof DIRECTIONS)[number]
/** A recorded direction may also be "no torsion". */
export type RecordedDirection = Direction | 'none'

export const PRISM_BASES = ['up', 'down', 'in', 'out'] as const
export type PrismBase = (typeof PRISM_BASES)[number]

export interface Prism {
  eye: Eye
  /** Power in prism dioptres (Δ). */
  power: number
  base: PrismBase
}

export const MODES = ['learner-turns', 'patient-turns'] as const
export type Mode = (typeof MODES)[number]

export const LIGHTS = ['dim', 'on'] as const
export type Lights = (typeof LIGHTS)[number]

export const TILT_SIDES = ['right', 'left'] as const
export type Side = (typeof TILT_SIDES)[number]

export interface PerEye<T> {
  RE: T
  LE: T
}

export interface PerDistance<T> {
  near: T
  distance: T
}

export type StreakColour = 'red' | 'white'
export type StreakPattern = 'solid' | 'dashed'

/** A point in the patient's view, in prism dioptres: x to the patient's right, y up. */
export interface Offset {
  x: number
  y: number
}

/** The eight cyclovertical muscles, by their usual clinical abbreviation. */
export const MUSCLES = ['RSO', 'LSO', 'RSR', 'LSR', 'RIR', 'LIR', 'RIO', 'LIO'] as const
export type Muscle = (typeof MUSCLES)[number]

export const DIFFICULTIES = ['standard', 'challenging'] as const
export type Difficulty = (typeof DIFFICULTIES)[number]

export const mapEyes = <T, U>(v: PerEye<T>, f: (value: T, eye: Eye) => U): PerEye<U> => ({
  RE: f(v.RE, 'RE'),
  LE: f(v.LE, 'LE'),
})

// ---- the patient's words (words.ts works them out) ----

export type SlopeSize = 'slight' | 'clear' | 'steep'

export type Observation
  = | { kind: 'lights-on' }
    | { kind: 'none-seen' }
    | { kind: 'one-line', seen: Eye }
    | { kind: 'out-of-view', eye: Eye }
    | { kind: 'overlap', crossing: boolean }
    | { kind: 'level', eye: Eye }
    | { kind: 'slopes', eye: Eye, lowEnd: 'left' | 'right', towards: 'nose' | 'ear', size: SlopeSize }
    | { kind: 'parallel', level: boolean }
    | { kind: 'not-parallel' }
    | { kind: 'unsure', eye?: Eye }

export interface PatientWords {
  text: string
  observations: Observation[]
}
