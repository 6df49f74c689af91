// Published normal figures for the disc–fovea angle, the normal range Cyclodial
// grades against, and the objective finding an angle stands for. Not secret: the
// range and its sources are shown to learners after they record a finding.

import type { Eye, PerEye } from '../types'

/** Sources, cited by the generator, the grader, the feedback and the tests. */
export const FUNDUS_SOURCES = {
  korean2005: 'The range of ocular torsion in mass screening, J Korean Ophthalmol Soc 2005;46(10):1684-9 — disc–fovea angle 6.26 ± 2.98° RE, 6.69 ± 2.84° LE (498 eyes); disc centre to fovea 2.59 ± 0.26 DD horizontally, 0.29 ± 0.14 DD vertically',
  bixenman1982: 'Bixenman & von Noorden, Ophthalmology 1982;89(1) — in normal eyes the fovea lies about 0.3 disc diameters below the horizontal through the disc centre',
  method2013: 'Korean J Ophthalmol 2013 (clinical-facts R45) — disc–fovea angle method: tan α = vertical offset / horizontal offset',
  adaptation1979: 'von Noorden, Ophthalmology 1979;86:1451-61 — long-standing palsies: the eye stays torted while sensory adaptation removes the subjective torsion',
  comparison2021: 'Liebermann et al., Am J Ophthalmol 2021;224:332-42 — fundus photographs and the double Maddox rod often disagree in the same patient',
  kang2020: 'Kang et al., PLoS One 2020 — unilateral superior oblique palsy: disc–fovea angle 12.19 ± 1.69° in the paretic eye against 6.71 ± 1.09° in the fellow eye',
  interEye1992: 'Madigan & Katz, J Pediatr Ophthalmol Strabismus 1992;29(3):171-4 — a difference of more than 4° between the two eyes\' disc–fovea angles is probably abnormal',
  flodin2020: 'Flodin et al., Acta Ophthalmol 2020;98:177-81 — normal subjective torsion on the double Maddox rod is about 1° excyclo',
  range: 'Cyclodial normal range: mean ± 2 SD of the 2005 mass-screening figures (derived)',
} as const

export interface NormalFigure {
  /** Mean disc–fovea angle, degrees. */
  mean: number
  /** Standard deviation, degrees. */
  sd: number
}

/** Disc–fovea angle in normal eyes (J Korean Ophthalmol Soc 2005;46(10):1684-9). */
export const NORMAL_DISC_FOVEA_ANGLE: PerEye<NormalFigure> = {
  RE: { mean: 6.26, sd: 2.98 },
  LE: { mean: 6.69, sd: 2.84 },
}

/** Horizontal distance from disc centre to fovea in disc diameters (same study). */
export const NORMAL_DISC_FOVEA_HORIZONTAL: NormalFigure = { mean: 2.59, sd: 0.26 }

export interface NormalRange {
  low: number
  high: number
  mean: number
  sd: number
}

const round2 = (v: number): number => Math.round(v * 100) / 100

/** Mean ± 2 SD: about 0.3° to 12.2° (RE) and 1.0° to 12.4° (LE). */
export function normalRange(eye: Eye): NormalRange {
  const { mean, sd } = NORMAL_DISC_FOVEA_ANGLE[eye]
  return { low: round2(mean - 2 * sd), high: round2(mean + 2 * sd), mean, sd }
}

export const NORMAL_RANGES: PerEye<NormalRange> = { RE: normalRange('RE'), LE: normalRange('LE') }

/**
 * Torsion a healthy eye shows on the double Maddox rod: about 1° excyclo (Flodin et
 * al., Acta Ophthalmol 2020;98:177-81). Cyclodial's healthy eyes lie within −0.5°
 * to 2° (domain.md §4: "both eyes within about ±2°"). It is what the patient
 * perceives, not a rotation of the eye, so from fundus version 2 an eye whose
 * torsion lies in this band is drawn with its normal disc–fovea angle, unturned.
 */
export const HEALTHY_SUBJECTIVE_TORSION = { low: -0.5, high: 2 } as const

/** Whether a signed torsion (+ = excyclo) is within what a healthy eye reports. */
export const isHealthySubjectiveTorsion = (t: number): boolean =>
  t >= HEALTHY_SUBJECTIVE_TORSION.low && t <= HEALTHY_SUBJECTIVE_TORSION.high

/** More than this difference between the eyes' angles is probably abnormal (Madigan & Katz 1992). */
export const INTER_EYE_DIFFERENCE_ABNORMAL = 4

/** What a learner records from a fundus photograph, per eye. */
export const FUNDUS_FINDINGS = ['excyclo', 'incyclo', 'within-normal'] as const
export type FundusFinding = (typeof FUNDUS_FINDINGS)[number]

export const FUNDUS_FINDING_LABELS: Record<FundusFinding, string> = {
  'excyclo': 'Excyclotorsion',
  'incyclo': 'Incyclotorsion',
  'within-normal': 'Within the normal range',
}

/** The objective finding an angle stands for: above the range excyclo, below it incyclo. */
export function findingForAngle(eye: Eye, angle: number): FundusFinding {
  const r = NORMAL_RANGES[eye]
  if (angle > r.high) return 'excyclo'
  if (angle < r.low) return 'incyclo'
  return 'within-normal'
}

/**
 * Findings accepted for an angle: near a limit of the range either side is fair,
 * because a degree is within what careful graders disagree on (clinical-facts R54).
 */
export function acceptableFindings(eye: Eye, angle: number, margin = 1): FundusFinding[] {
  const found = new Set<FundusFinding>([findingForAngle(eye, angle - margin), findingForAngle(eye, angle), findingForAngle(eye, angle + margin)])
  return FUNDUS_FINDINGS.filter(f => found.has(f))
}
