// One generator per condition family. Each draws its numbers in a fixed order
// from the seeded generator and describes the case with the affected eye on the
// RIGHT; the generator mirrors it for left-sided templates, so a right and a left
// case from the same seed are exact mirror images.

import { uniform } from '#shared/engine/random'
import type { Rng } from '#shared/engine/random'
import type { Eye, Gaze, Muscle, PerDistance, PerEye } from '#shared/engine/types'
import type { Behaviour, Condition } from './types'
import type { CaseTemplate, TemplateRanges } from './templates'
import { GAZE_VECTOR } from './muscles'
import {
  addVertical,
  drawInRange,
  drawPalsyShape,
  normalEyeTorsion,
  palsyTorsion,
  palsyVertical,
  byGaze,
} from './patterns'
import type { GazeNumbers, VerticalPattern } from './patterns'

export interface CaseDraft {
  torsion: Record<Gaze, PerEye<number>>
  reported: Record<Gaze, PerEye<number>>
  vertical: VerticalPattern
  horizontal: Record<Gaze, PerDistance<number>>
  fixingEye: Eye
  affectedEye: Eye | null
  muscles: Muscle[]
  behaviours: Behaviour[]
  seenEye?: Eye
  /** Whether the patient would notice a tilt themselves (drives the opening words). */
  acquired: boolean
}

const both = (re: GazeNumbers, le: GazeNumbers): Record<Gaze, PerEye<number>> =>
  Object.fromEntries(Object.keys(re).map(g => [g, { RE: re[g as Gaze], LE: le[g as Gaze] }])) as Record<Gaze, PerEye<number>>

const constant = (v: number): GazeNumbers => byGaze(() => v)

const comitantHorizontal = (rng: Rng, r: TemplateRanges): Record<Gaze, PerDistance<number>> => {
  const near = drawInRange(rng, r.horizontal.near)
  const distance = drawInRange(rng, r.horizontal.distance)
  return Object.fromEntries(Object.keys(constant(0)).map(g => [g, { near, distance }])) as Record<Gaze, PerDistance<number>>
}

const noVertical = (): VerticalPattern => ({ gazes: constant(0), headTilt: { right: 0, left: 0 }, supine: 0 })

/** A single weak muscle of the right eye (SO, IO, SR or IR palsy). */
function singlePalsy(rng: Rng, muscle: Muscle, r: TemplateRanges): CaseDraft {
  const t0 = drawInRange(rng, r.torsion)
  const gainV = drawInRange(rng, r.fieldGain)
  const gainH = uniform(rng, 0, 0.15)
  const shape = drawPalsyShape(rng, r.vertical)
  const fellow = normalEyeTorsion(rng)
  const torsion = both(palsyTorsion(muscle, t0, gainV, gainH), constant(fellow))
  return {
    torsion,
    reported: torsion,
    vertical: palsyVertical(muscle, shape),
    horizontal: comitantHorizontal(rng, r),
    fixingEye: 'LE',
    affectedEye: 'RE',
    muscles: [muscle],
    behaviours: [],
    acquired: true,
  }
}

function bilateralSo(rng: Rng, t: CaseTemplate): CaseDraft {
  const r = t.ranges
  const total = drawInRange(rng, r.torsion)
  const share = t.difficulty === 'standard' ? uniform(rng, 0.4, 0.6) : uniform(rng, 0.25, 0.75)
  const gainV = drawInRange(rng, r.fieldGain)
  const gainH = uniform(rng, 0, 0.15)
  // one shape for both muscles, the left a little stronger or weaker: the hypertropia
  // then reverses in side gaze and on head tilt (von Noorden et al. 1986)
  const shape = drawPalsyShape(rng, r.vertical)
  const ratio = uniform(rng, 0.7, 1.4)
  const vertical = addVertical(palsyVertical('RSO', shape), palsyVertical('LSO', { ...shape, m: shape.m * ratio }))
  const nearBase = drawInRange(rng, r.horizontal.near)
  const distBase = drawInRange(rng, r.horizontal.distance)
  // V pattern: more eso in downgaze than in upgaze
  const vSpread = uniform(rng, 5, 10)
  const horizontal = Object.fromEntries(
    Object.entries(GAZE_VECTOR).map(([g, { v }]) => [g, { near: nearBase - v * vSpread, distance: distBase - v * vSpread }]),
  ) as Record<Gaze, PerDistance<number>>
  const torsion = both(palsyTorsion('RSO', total * share, gainV, gainH), palsyTorsion('LSO', total * (1 - share), gainV, gainH))
  return {
    torsion,
    reported: torsion,
    vertical,
    horizontal,
    fixingEye: 'RE',
    affectedEye: null,
    muscles: ['RSO', 'LSO'],
    behaviours: [],
    acquired: true,
  }
}

/** Thyroid eye disease: a tight inferior rectus holds the eye down and excyclotorted. */
function ted(rng: Rng, t: CaseTemplate): CaseDraft {
  const r = t.ranges
  const bilateral = t.difficulty === 'challenging'
  const amount = drawInRange(rng, r.torsion)
  const share = bilateral ? uniform(rng, 0.4, 0.6) : 1
  const gain = drawInRange(rng, r.fieldGain)
  const m = drawInRange(rng, r.vertical)
  const kUp = uniform(rng, 0.8, 1.5)
  const kDown = uniform(rng, 0.5, 0.8)
  const tilts = [uniform(rng, 0.9, 1.1), uniform(rng, 0.9, 1.1)] as const
  const supine = uniform(rng, 0.8, 1)
  const fellow = normalEyeTorsion(rng)
  // restriction is worst on looking up (the tight muscle is stretched); the three-step
  // test does not apply to a restriction
  const upFactor = (v: number) => (v > 0 ? 1 + kUp : v < 0 ? 1 - kDown : 1)
  const gazes = byGaze(g => -m * upFactor(GAZE_VECTOR[g].v) * (1 + 0.2 * GAZE_VECTOR[g].h))
  const re = byGaze(g => amount * share * (1 + gain * GAZE_VECTOR[g].v))
  const le = bilateral ? byGaze(g => amount * (1 - share) * (1 + gain * GAZE_VECTOR[g].v)) : constant(fellow)
  const torsion = both(re, le)
  return {
    torsion,
    reported: torsion,
    vertical: { gazes, headTilt: { right: -m * tilts[0], left: -m * tilts[1] }, supine: -m * supine },
    horizontal: comitantHorizontal(rng, r),
    fixingEye: 'LE',
    affectedEye: bilateral ? null : 'RE',
    muscles: [],
    behaviours: [],
    acquired: true,
  }
}

/** Skew deviation with the right eye higher: a roughly comitant hypertropia that halves lying down. */
function skew(rng: Rng, t: CaseTemplate): CaseDraft {
  const r = t.ranges
  const m = drawInRange(rng, r.vertical)
  const gazes = byGaze(() => m * uniform(rng, 0.9, 1.1))
  const headTilt = { right: m * uniform(rng, 0.85, 1.15), left: m * uniform(rng, 0.85, 1.15) }
  const supine = m * uniform(rng, 0.1, 0.45)
  let torsion: Record<Gaze, PerEye<number>>
  if (t.difficulty === 'standard') {
    // ocular tilt reaction: hypertropic eye incyclo, hypotropic eye excyclo
    const hyper = drawInRange(rng, r.torsion)
    const hypo = drawInRange(rng, r.torsion)
    const gain = drawInRange(rng, r.fieldGain)
    torsion = both(
      byGaze(g => -hyper * (1 + gain * GAZE_VECTOR[g].v)),
      byGaze(g => hypo * (1 - gain * GAZE_VECTOR[g].v)),
    )
  }
  else {
    torsion = both(constant(normalEyeTorsion(rng)), constant(normalEyeTorsion(rng)))
  }
  return {
    torsion,
    reported: torsion,
    vertical: { gazes, headTilt, supine },
    horizontal: comitantHorizontal(rng, r),
    fixingEye: 'LE',
    affectedEye: null,
    muscles: [],
    behaviours: [],
    acquired: true,
  }
}

/** Long-standing right SO palsy: torted eye, little or no torsion reported. */
function longStanding(rng: Rng, t: CaseTemplate): CaseDraft {
  const d = singlePalsy(rng, 'RSO', t.ranges)
  const r = t.ranges
  const share = drawInRange(rng, r.reportedShare ?? [0, 0])
  const fellowReported = r.fellowReported ? drawInRange(rng, r.fellowReported) : null
  const reported = Object.fromEntries(
    Object.entries(d.torsion).map(([g, v]) => [g, { RE: v.RE * share, LE: fellowReported ?? v.LE }]),
  ) as Record<Gaze, PerEye<number>>
  return {
    ...d,
    reported,
    // when the paretic eye fixes, the non-paretic eye may report the excyclo (clinical-facts §4.3)
    fixingEye: fellowReported === null ? 'LE' : 'RE',
    behaviours: ['under-reports'],
    acquired: false,
  }
}

/**
 * Two eyes with normal torsion, a comitant vertical of a drawn size and side, and a
 * comitant horizontal deviation, the right eye fixing — what suppression and normal
 * cases share. The seeded draws stay in this order and the draft's fields in this
 * order (tests/unit/engine/families-digest.test.ts); a normal case with no vertical
 * deviation drawn has none at all (`noVertical`).
 */
function quietEyes(rng: Rng, r: TemplateRanges, own: Pick<CaseDraft, 'affectedEye' | 'behaviours' | 'seenEye' | 'acquired'>, zeroIsNone: boolean): CaseDraft {
  const torsion = both(constant(normalEyeTorsion(rng)), constant(normalEyeTorsion(rng)))
  const m = drawInRange(rng, r.vertical) * (rng() < 0.5 ? 1 : -1)
  const { seenEye, ...rest } = own
  return {
    torsion,
    reported: torsion,
    vertical: zeroIsNone && m === 0 ? noVertical() : { gazes: constant(m), headTilt: { right: m, left: m }, supine: m },
    horizontal: comitantHorizontal(rng, r),
    fixingEye: 'RE',
    affectedEye: rest.affectedEye,
    muscles: [],
    behaviours: rest.behaviours,
    ...(seenEye ? { seenEye } : {}),
    acquired: rest.acquired,
  }
}

/** Suppression of the left eye's streak while the right eye fixes. */
function suppression(rng: Rng, t: CaseTemplate): CaseDraft {
  const behaviours: CaseDraft['behaviours'] = [t.difficulty === 'standard' ? 'one-streak-only' : 'intermittent-one-streak']
  return quietEyes(rng, t.ranges, { affectedEye: 'LE', behaviours, seenEye: 'RE', acquired: false }, false)
}

function normalCase(rng: Rng, t: CaseTemplate): CaseDraft {
  return quietEyes(rng, t.ranges, { affectedEye: null, behaviours: [], acquired: true }, true)
}

const SINGLE: Partial<Record<Condition, Muscle>> = {
  'so-palsy': 'RSO',
  'io-palsy': 'RIO',
  'sr-palsy': 'RSR',
  'ir-palsy': 'RIR',
}

/** The families drawn by a function of their own (single palsies share `singlePalsy`). */
const DRAW: Partial<Record<Condition, (rng: Rng, t: CaseTemplate) => CaseDraft>> = {
  'bilateral-so-palsy': bilateralSo,
  'ted-ir-restriction': ted,
  'skew-deviation': skew,
  'long-standing-so-palsy': longStanding,
  'suppression': suppression,
  'normal': normalCase,
}

export function draftFor(rng: Rng, t: CaseTemplate): CaseDraft {
  const single = SINGLE[t.family]
  if (single) return singlePalsy(rng, single, t.ranges)
  const draw = DRAW[t.family]
  if (!draw) throw new Error(`No generator for the case family "${t.family}".`)
  return draw(rng, t)
}
