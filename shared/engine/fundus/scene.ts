// The procedural drawing model of a fundus: from a picture's geometry and its
// look key, the shapes to paint (background tint, choroidal mottling, optic disc
// and cup, arcade vessels, macula and fovea). Pure and seeded, so the same case
// always draws the same picture on every machine; the canvas code only paints.
//
// Anatomy drawn, in the disc–fovea frame (u from disc to fovea, v towards the
// inferior retina, units of disc diameters): superior and inferior temporal arcades
// arch around the macula, nasal branches leave the other side of the disc, small
// branches reach towards but never into the avascular fovea. Model choices, not
// published figures.

import type { Rng } from '../random'
import { makeRng } from '../random'
import type { Point } from './geometry'
import { fromFrame, fundusFrame } from './geometry'
import type { FundusPicture } from './picture'

export interface Vessel {
  kind: 'artery' | 'vein'
  /** Main vessels leave the disc; branches leave a main vessel. */
  from: 'disc' | 'branch'
  /** Width in disc diameters at the disc end; it tapers to about a third. */
  width: number
  points: Point[]
}

export interface FundusScene {
  /** 0 = lightly pigmented (orange), 1 = darkly pigmented (brown-red). */
  pigment: number
  mottles: { x: number, y: number, r: number, light: boolean }[]
  disc: { x: number, y: number, rx: number, ry: number, rotation: number, cup: number }
  macula: { x: number, y: number, radius: number }
  fovea: Point
  vessels: Vessel[]
}

type Path = [number, number][]

const jitter = (rng: Rng, amount: number): number => (rng() * 2 - 1) * amount

/** Catmull–Rom through the control points, sampled evenly: smooth, deterministic curves. */
function smooth(points: Point[], steps = 8): Point[] {
  if (points.length < 3) return points
  const out: Point[] = []
  for (let i = 0; i < points.length - 1; i++) {
    const p0 = points[Math.max(0, i - 1)]!
    const p1 = points[i]!
    const p2 = points[i + 1]!
    const p3 = points[Math.min(points.length - 1, i + 2)]!
    for (let s = 0; s < steps; s++) {
      const t = s / steps
      const t2 = t * t
      const t3 = t2 * t
      const f = (a: number, b: number, c: number, d: number) =>
        0.5 * (2 * b + (-a + c) * t + (2 * a - 5 * b + 4 * c - d) * t2 + (-a + 3 * b - 3 * c + d) * t3)
      out.push({ x: f(p0.x, p1.x, p2.x, p3.x), y: f(p0.y, p1.y, p2.y, p3.y) })
    }
  }
  out.push(points[points.length - 1]!)
  return out
}

// Control paths in the (u, v) frame. `v` negative = superior. Each arcade is a vein
// with its artery running alongside.
const ARCADE: Path = [[0.05, -0.12], [0.25, -0.55], [0.8, -1.15], [1.7, -1.55], [2.7, -1.6], [3.7, -1.3], [4.6, -0.75], [5.3, -0.1]]
const NASAL: Path = [[-0.05, -0.15], [-0.35, -0.6], [-1.0, -1.25], [-1.9, -1.8], [-2.9, -2.2]]
const NASAL_MID: Path = [[-0.1, -0.05], [-0.6, -0.2], [-1.4, -0.35], [-2.5, -0.45], [-3.4, -0.4]]

function wobble(rng: Rng, path: Path, amount: number, flip: 1 | -1): Path {
  return path.map(([a, b], i) => [a + (i ? jitter(rng, amount) : 0), flip * (b + (i ? jitter(rng, amount) : 0))])
}

function branchesOf(rng: Rng, trunk: Point[], kind: Vessel['kind'], width: number, towardsFovea: Point | null): Vessel[] {
  const out: Vessel[] = []
  const count = 2 + Math.floor(rng() * 3)
  for (let k = 0; k < count; k++) {
    const at = Math.floor(trunk.length * (0.25 + 0.6 * rng()))
    const start = trunk[Math.min(at, trunk.length - 2)]!
    const next = trunk[Math.min(at + 1, trunk.length - 1)]!
    const dir = Math.atan2(next.y - start.y, next.x - start.x) + (rng() < 0.5 ? 1 : -1) * (0.5 + 0.6 * rng())
    let heading = dir
    if (towardsFovea && rng() < 0.5) {
      // a macular branch: heads for the fovea but stops short of the avascular zone
      heading = Math.atan2(towardsFovea.y - start.y, towardsFovea.x - start.x)
    }
    const length = 0.8 + 1.4 * rng()
    const pts: Point[] = [start]
    let p = start
    for (let s = 1; s <= 4; s++) {
      heading += jitter(rng, 0.25)
      p = { x: p.x + Math.cos(heading) * length / 4, y: p.y + Math.sin(heading) * length / 4 }
      if (towardsFovea && Math.hypot(p.x - towardsFovea.x, p.y - towardsFovea.y) < 0.45) break
      pts.push(p)
    }
    if (pts.length > 1) out.push({ kind, from: 'branch', width: width * (0.45 + 0.2 * rng()), points: smooth(pts, 4) })
  }
  return out
}

/** The shapes of one eye's fundus. Same picture → same scene, always. */
export function fundusScene(picture: FundusPicture): FundusScene {
  const rng = makeRng(`cyclodial/fundus-scene/v1/${picture.lookKey}`)
  const { disc, fovea } = picture
  const frame = fundusFrame(picture.eye, disc, fovea)
  const toPicture = ([a, b]: [number, number]): Point => fromFrame(frame, disc, a, b)

  const pigment = rng()
  const vessels: Vessel[] = []
  for (const flip of [1, -1] as const) {
    for (const [path, veinWidth] of [[ARCADE, 0.13], [NASAL, 0.1], [NASAL_MID, 0.075]] as const) {
      const vein = smooth(wobble(rng, path as Path, 0.12, flip).map(toPicture))
      const artery = smooth(wobble(rng, (path as Path).map(([a, b]) => [a + 0.08, b * 0.93 + 0.04]), 0.12, flip).map(toPicture))
      vessels.push({ kind: 'vein', from: 'disc', width: veinWidth, points: vein })
      vessels.push({ kind: 'artery', from: 'disc', width: veinWidth * 0.72, points: artery })
      const nearFovea = path === ARCADE ? fovea : null
      vessels.push(...branchesOf(rng, vein, 'vein', veinWidth, nearFovea))
      vessels.push(...branchesOf(rng, artery, 'artery', veinWidth * 0.72, nearFovea))
    }
  }

  const mottles: FundusScene['mottles'] = []
  for (let i = 0; i < 140; i++) {
    mottles.push({
      x: picture.field.x + jitter(rng, picture.field.radius),
      y: picture.field.y + jitter(rng, picture.field.radius),
      r: 0.12 + 0.35 * rng(),
      light: rng() < 0.5,
    })
  }

  return {
    pigment,
    mottles,
    disc: {
      x: disc.x,
      y: disc.y,
      rx: disc.width / 2,
      ry: disc.height / 2,
      // the disc's long axis lies across the disc–fovea line, so it turns with the fundus
      rotation: Math.atan2(frame.u.y, frame.u.x),
      cup: 0.25 + 0.25 * rng(),
    },
    macula: { x: fovea.x, y: fovea.y, radius: 0.85 + 0.2 * rng() },
    fovea: { ...fovea },
    vessels,
  }
}
