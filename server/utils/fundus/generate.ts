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

import type { Point } from '#shared/engine/fundus/geometry'
import { discFoveaAngle, foveaFrom, temporalSign, tortPoint } from '#shared/engine/fundus/geometry'
import { NORMAL_DISC_FOVEA_ANGLE, NORMAL_DISC_FOVEA_HORIZONTAL } from '#shared/engine/fundus/normals'
import type { NormalFigure } from '#shared/engine/fundus/normals'
import type { FundusPicture } from '#shared/engine/fundus/picture'
import type { Rng } from '#shared/engine/random'
import { makeRng, normal, round1 } from '#shared/engine/random'
import type { Eye, PerEye } from '#shared/engine/types'
import { specKey } from '../engine/generator'
import type { Case } from '../engine/types'

/** Bump when a change would move a generated disc or fovea; keep old versions replayable. */
export const FUNDUS_VERSION = 1
export const SUPPORTED_FUNDUS_VERSIONS: readonly number[] = [1]

/** Picture frame and camera field, disc diameters (a 45° camera sees about 7 DD across: model choice). */
const FRAME = { width: 8, height: 6 }
const FIELD_RADIUS = 3.6
/** Disc a little taller than wide (model choice). */
const DISC_SIZE = { width: 0.96, height: 1.08 }

export interface FundusEyeTruth {
  eye: Eye
  /** This eye's disc–fovea angle before torsion, degrees (drawn from the normal distribution). */
  normalAngle: number
  /** Objective torsion applied, degrees, + = excyclo (the case's primary-position torsion). */
  torsion: number
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
 * A draw from N(mean, sd) kept within mean ± 2 SD: a normal eye's fundus always
 * looks normal, so the grading never calls a case's healthy eye torted.
 */
export function drawWithinTwoSd(rng: Rng, figure: NormalFigure): number {
  for (let i = 0; i < 64; i++) {
    const v = normal(rng, figure.mean, figure.sd)
    if (Math.abs(v - figure.mean) <= 2 * figure.sd) return v
  }
  return figure.mean
}

const round3 = (v: number): number => Math.round(v * 1000) / 1000
const roundPoint = (p: Point): Point => ({ x: round3(p.x), y: round3(p.y) })

function eyeFundus(c: Case, eye: Eye, version: number): FundusEyeTruth {
  const rng = makeRng(`cyclodial/fundus/v${version}/${c.templateId ?? 'spec'}/${c.seed}/${eye}`)
  const normalAngle = round1(drawWithinTwoSd(rng, NORMAL_DISC_FOVEA_ANGLE[eye]))
  const horizontal = Math.round(drawWithinTwoSd(rng, NORMAL_DISC_FOVEA_HORIZONTAL) * 100) / 100
  const torsion = c.gazes.primary.torsion[eye]
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
  const lookKey = specKey(`fundus|${version}|${c.templateId ?? ''}|${c.seed}|${eye}`).replace('spec-', 'f-')
  return {
    eye,
    normalAngle,
    torsion,
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
