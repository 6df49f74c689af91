// Disc–fovea geometry (domain.md §6). Pure maths shared by the server (truth and
// grading) and the browser (the live angle while a learner places marks).
//
// Conventions — read these before changing anything:
// - A fundus picture is an UPRIGHT photograph, seen as if looking into the eye from
//   in front (the way a fundus camera shows it, not the inverted indirect view).
// - Picture coordinates: x to the viewer's right, y DOWN (as on a canvas or an image),
//   in any unit (disc diameters for generated pictures, pixels for uploaded photographs:
//   the angle does not depend on the unit).
// - The optic disc is nasal to the fovea. On an upright photograph of the RIGHT eye the
//   disc is on the viewer's right and the fovea to its left; on the LEFT eye the other
//   way round. `temporalSign` is the x direction from disc to fovea.
// - The disc–fovea angle is the angle between the horizontal through the disc centre and
//   the line from the disc centre to the fovea: tan α = vertical offset / horizontal offset
//   (clinical-facts §5, R45). POSITIVE when the fovea lies BELOW that horizontal, for both
//   eyes. Normal eyes average about 6–7° (J Korean Ophthalmol Soc 2005;46(10):1684-9).
// - Excyclotorsion (top of the eye towards the ear) turns the right eye's fundus
//   counter-clockwise as the viewer sees it and the left eye's clockwise; either way the
//   disc rises relative to the fovea, so EXCYCLOTORSION INCREASES THE ANGLE in both eyes
//   by the amount of torsion, and incyclotorsion decreases it.

import type { Eye } from '../types'

export interface Point {
  x: number
  y: number
}

const RAD = Math.PI / 180

/** x direction from disc centre to fovea on an upright photograph: RE −1 (left), LE +1 (right). */
export const temporalSign = (eye: Eye): 1 | -1 => (eye === 'RE' ? -1 : 1)

/**
 * The disc–fovea angle in degrees, in (−180°, 180°]: positive = fovea below the
 * disc-centre horizontal. A value beyond ±90° means the fovea mark is on the nasal
 * side of the disc (marks swapped, or the wrong eye).
 */
export function discFoveaAngle(eye: Eye, disc: Point, fovea: Point): number {
  const along = (fovea.x - disc.x) * temporalSign(eye)
  const below = fovea.y - disc.y
  return Math.atan2(below, along) / RAD
}

/** Distance between two points, in the picture's unit. */
export const distance = (a: Point, b: Point): number => Math.hypot(a.x - b.x, a.y - b.y)

/**
 * Rotate `p` about `centre` by `degrees` counter-clockwise as the viewer sees the
 * picture (y down, so the formula differs from the y-up textbook one in two signs).
 */
export function rotateAbout(p: Point, centre: Point, degrees: number): Point {
  const c = Math.cos(degrees * RAD)
  const s = Math.sin(degrees * RAD)
  const dx = p.x - centre.x
  const dy = p.y - centre.y
  return { x: centre.x + dx * c + dy * s, y: centre.y - dx * s + dy * c }
}

/** Counter-clockwise (as viewed) rotation of an eye's fundus for a signed torsion (+ = excyclo). */
export const torsionRotation = (eye: Eye, torsion: number): number => (eye === 'RE' ? torsion : -torsion)

/** Turn a point of an eye's fundus by that eye's torsion about the fovea. */
export const tortPoint = (eye: Eye, p: Point, fovea: Point, torsion: number): Point =>
  rotateAbout(p, fovea, torsionRotation(eye, torsion))

/**
 * Where the fovea lies for a disc centre, an angle and a horizontal distance
 * (the distance along the disc-centre horizontal, not along the line).
 */
export function foveaFrom(eye: Eye, disc: Point, angle: number, horizontal: number): Point {
  return { x: disc.x + temporalSign(eye) * horizontal, y: disc.y + horizontal * Math.tan(angle * RAD) }
}

/**
 * A frame along the disc–fovea line for drawing an eye's fundus: `u` points from the
 * disc to the fovea, `v` at right angles towards the inferior retina. Vessels drawn in
 * (u, v) turn with the disc and fovea, so a torted fundus turns as one piece.
 */
export function fundusFrame(eye: Eye, disc: Point, fovea: Point): { u: Point, v: Point } {
  const d = distance(disc, fovea) || 1
  const u = { x: (fovea.x - disc.x) / d, y: (fovea.y - disc.y) / d }
  const s = temporalSign(eye)
  return { u, v: { x: -s * u.y, y: s * u.x } }
}

/** A point given in the (u, v) frame (origin at the disc centre), back in picture coordinates. */
export const fromFrame = (frame: { u: Point, v: Point }, disc: Point, a: number, b: number): Point => ({
  x: disc.x + a * frame.u.x + b * frame.v.x,
  y: disc.y + a * frame.u.y + b * frame.v.y,
})
