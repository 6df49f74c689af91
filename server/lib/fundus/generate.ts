// The fundus of a generated case (issue 7): each eye's normal disc–fovea angle is
// drawn from the published normal distribution, then the whole fundus is turned
// about the fovea by that eye's objective torsion in primary position. Derived
// from the case alone in its own versioned, seeded function, so it never changes
// what GENERATOR_VERSION makes, and the same case always shows the same fundus.
//
// Sources: disc–fovea angle 6.26 ± 2.98° RE, 6.69 ± 2.84° LE and horizontal
// distance 2.59 ± 0.26 DD (J Korean Ophthalmol Soc 2005;46(10):1684-9); the fovea
// about 0.3 DD below the disc-centre horizontal (Bixenman & von Noorden,
// Ophthalmology 1982). Excyclotorsion raises the angle in both eyes (domain.md §6).
//
// Version 2 (issue 11): a healthy eye's fundus is never turned. The about 1° excyclo
// a healthy eye reports on the double Maddox rod (Flodin et al., Acta Ophthalmol
// 2020;98:177-81) is a perception, not a rotation of the eye, so an eye whose
// torsion lies in that band (HEALTHY_SUBJECTIVE_TORSION, −0.5° to 2°) keeps its
// normal angle, and normal angles are drawn a little inside mean ± 2 SD so that
// rounding can never carry a healthy picture out of the normal range. Version 1
// (every eye turned by its case torsion) stays replayable for stored attempts.
// Both versions draw from the same seeded stream and share the vessel look, so an
// affected eye's picture is the same in both.

import type { Point } from '#shared/engine/fundus/geometry'
import { discFoveaAngle, foveaFrom, temporalSign, tortPoint } from '#shared/engine/fundus/geometry'
import { NORMAL_DISC_FOVEA_ANGLE, NORMAL_DISC_FOVEA_HORIZONTAL, isHealthySubjectiveTorsion } from '#shared/engine/fundus/normals'
import type { NormalFigure } from '#shared/engine/fundus/normals'
import type { FundusPicture } from '#shared/engine/fundus/picture'
import type { Rng } from '#shared/engine/random'
import { makeRng, normal, round1 } from '#shared/engine/random'
import type { Eye, PerEye } from '#shared/engine/types'
import { specKey } from '~~/server/lib/engine/generator'
import type { Case } from '~~/server/lib/engine/types'

/** Bump when a change would move a generated disc or fovea; keep old versions replayable. */
export const FUNDUS_VERSION = 2
export const SUPPORTED_FUNDUS_VERSIONS: readonly number[] = [1, 2]

/** Version 2 draws a normal angle at least this far inside mean ± 2 SD, degrees (covers rounding to 0.1°). */
const RANGE_MARGIN = 0.2

/** Picture frame and camera field, disc diameters (a 45° camera sees about 7 DD across: model choice). */
const FRAME = { width: 8, height: 6 }
const FIELD_RADIUS = 3.6
/** Disc a little taller than wide (model choice). */
const DISC_SIZE = { width: 0.96, height: 1.08 }

export interface FundusEyeTruth {
  eye: Eye
  /** This eye's disc–fovea angle before torsion, degrees (drawn from the normal distribution). */
  normalAngle: number
  /**
   * Objective torsion applied, degrees, + = excyclo: the case's primary-position
   * torsion, or 0 (version 2) for a healthy eye whose torsion is only the normal subjective excyclo.
   */
  torsion: number
  /** Version 2: the eye's case torsion is within what a healthy eye reports, so the fundus is not turned. */
  healthy: boolean
  /** The disc–fovea angle the picture shows (normalAngle + torsion), degrees, measured on the picture. */
  angle: number
  /** Horizontal disc-centre-to-fovea distance before torsion, DD. */
  horizontal: number
  picture: FundusPicture
}

export interface FundusTruth {
  fundusVersion: number
  eyes: PerEye<FundusEyeTruth>
}

/**
 * A draw from N(mean, sd) kept within mean ± 2 SD (version 1's normal angle, and the
 * disc–fovea distance). Version 1 then added the case torsion, which could carry a
 * healthy eye's angle out of the normal range; version 2 does not (drawInsideTwoSd).
 */
export function drawWithinTwoSd(rng: Rng, figure: NormalFigure): number {
  for (let i = 0; i < 64; i++) {
    const v = normal(rng, figure.mean, figure.sd)
    if (Math.abs(v - figure.mean) <= 2 * figure.sd) return v
  }
  return figure.mean
}

/** Version 2: a draw from N(mean, sd) kept within mean ± (2 SD − margin). */
export function drawInsideTwoSd(rng: Rng, figure: NormalFigure, margin: number): number {
  for (let i = 0; i < 64; i++) {
    const v = normal(rng, figure.mean, figure.sd)
    if (Math.abs(v - figure.mean) <= 2 * figure.sd - margin) return v
  }
  return figure.mean
}

/** The torsion a version turns an eye's fundus by, and whether the eye counts as healthy. */
export function fundusTorsion(c: Case, eye: Eye, version: number): { torsion: number, healthy: boolean } {
  const t = c.gazes.primary.torsion[eye]
  if (version < 2) return { torsion: t, healthy: false }
  const healthy = isHealthySubjectiveTorsion(t)
  return { torsion: healthy ? 0 : t, healthy }
}

const round3 = (v: number): number => Math.round(v * 1000) / 1000
const roundPoint = (p: Point): Point => ({ x: round3(p.x), y: round3(p.y) })

function eyeFundus(c: Case, eye: Eye, version: number): FundusEyeTruth {
  // version 2 keeps version 1's stream and look, so only what version 2 changes moves
  const stream = 1
  const rng = makeRng(`cyclodial/fundus/v${stream}/${c.templateId ?? 'spec'}/${c.seed}/${eye}`)
  const normalAngle = round1(version < 2
    ? drawWithinTwoSd(rng, NORMAL_DISC_FOVEA_ANGLE[eye])
    : drawInsideTwoSd(rng, NORMAL_DISC_FOVEA_ANGLE[eye], RANGE_MARGIN))
  const horizontal = Math.round(drawWithinTwoSd(rng, NORMAL_DISC_FOVEA_HORIZONTAL) * 100) / 100
  const { torsion, healthy } = fundusTorsion(c, eye, version)
  // The camera centres roughly between disc and fovea (a little seeded offset).
  const fovea: Point = {
    x: FRAME.width / 2 + temporalSign(eye) * horizontal / 2 + (rng() - 0.5) * 0.5,
    y: FRAME.height / 2 + (rng() - 0.5) * 0.4,
  }
  // Place the untorted disc from the fovea, then turn the fundus about the fovea.
  const untortedFovea = foveaFrom(eye, { x: 0, y: 0 }, normalAngle, horizontal)
  const untortedDisc = { x: fovea.x - untortedFovea.x, y: fovea.y - untortedFovea.y }
  const disc = tortPoint(eye, untortedDisc, fovea, torsion)
  const picturedDisc = roundPoint(disc)
  const picturedFovea = roundPoint(fovea)
  const lookKey = specKey(`fundus|${stream}|${c.templateId ?? ''}|${c.seed}|${eye}`).replace('spec-', 'f-')
  return {
    eye,
    normalAngle,
    torsion,
    healthy,
    angle: round1(discFoveaAngle(eye, picturedDisc, picturedFovea)),
    horizontal,
    picture: {
      eye,
      frame: { ...FRAME },
      field: { x: FRAME.width / 2, y: FRAME.height / 2, radius: FIELD_RADIUS },
      disc: { ...picturedDisc, ...DISC_SIZE },
      fovea: picturedFovea,
      lookKey,
    },
  }
}

/** The fundus of both eyes of a case, deterministically from the case and the version. */
export function fundusForCase(c: Case, version: number = FUNDUS_VERSION): FundusTruth {
  if (!SUPPORTED_FUNDUS_VERSIONS.includes(version)) {
    throw new Error(`Fundus version ${version} is not available (this build makes version ${FUNDUS_VERSION}).`)
  }
  return { fundusVersion: version, eyes: { RE: eyeFundus(c, 'RE', version), LE: eyeFundus(c, 'LE', version) } }
}
