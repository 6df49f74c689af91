// Geometry of the trial frame as the examiner sees it from in front (ISO 8429:1986:
// 0° at the examiner's right, angles increasing anticlockwise, the same scale for
// both eyes). Pure functions, so the drawing and the tests share one source.

import { normaliseAxis, wrapAxisDifference } from '#shared/engine/dial'
import type { Eye } from '#shared/engine/types'

export interface Point { x: number, y: number }

export interface CellLayout {
  eye: Eye
  /** Centre of the cell, CSS pixels. */
  cx: number
  cy: number
  /** Radius of the engraved scale's inner edge. */
  radius: number
  /** Radius of the rod's glass aperture. */
  aperture: number
}

export interface FrameLayout {
  width: number
  height: number
  cells: Record<Eye, CellLayout>
  /** Figures are engraved every this many degrees (10, or 15 on a small frame). */
  figureStep: 10 | 15
}

/** Width : height of the trial-frame canvas. */
export const FRAME_ASPECT = 0.44

/**
 * Where the two cells sit. Seen from in front, the patient's RIGHT eye is on the
 * examiner's LEFT, so the RE cell is drawn on the left.
 */
export function frameLayout(width: number, height = width * FRAME_ASPECT): FrameLayout {
  // the rim (1.34 R) of each cell must fit the height and leave a gap between the cells
  const radius = Math.max(30, Math.min(width * 0.155, height * 0.36))
  const cy = height / 2
  const cell = (eye: Eye, fx: number): CellLayout => ({ eye, cx: width * fx, cy, radius, aperture: radius * 0.8 })
  return {
    width,
    height,
    cells: { RE: cell('RE', 0.25), LE: cell('LE', 0.75) },
    figureStep: radius >= 95 ? 10 : 15,
  }
}

/** A point at `r` from the centre along dial angle `deg` (ISO 8429, examiner's view) in canvas coordinates (y down). */
export function polar(cell: Pick<CellLayout, 'cx' | 'cy'>, deg: number, r: number): Point {
  const rad = (deg * Math.PI) / 180
  return { x: cell.cx + r * Math.cos(rad), y: cell.cy - r * Math.sin(rad) }
}

export interface Tick {
  angle: number
  /** Every 5°; `long` where a figure is engraved. */
  long: boolean
  figure: string | null
}

/** The engraved scale on the upper half of a cell: a tick every 5°, figures every 10° or 15°. */
export function scaleTicks(figureStep: 10 | 15 = 10): Tick[] {
  const ticks: Tick[] = []
  for (let a = 0; a <= 180; a += 5) {
    const long = a % figureStep === 0
    ticks.push({ angle: a, long, figure: long ? String(a) : null })
  }
  return ticks
}

/** Dial angle (rod axis, 0–180) pointed at from the centre of a cell. */
export function axisAtPoint(cell: Pick<CellLayout, 'cx' | 'cy'>, p: Point): number {
  const deg = (Math.atan2(cell.cy - p.y, p.x - cell.cx) * 180) / Math.PI
  return normaliseAxis(deg)
}

/**
 * How much of the pointer's turn reaches the rod. Inside the scale the rod follows
 * the pointer; further out it turns more slowly, like a vernier, so a long lever
 * gives a finer setting. Never below a tenth.
 */
export function dragGain(distanceFromCentre: number, radius: number): number {
  if (distanceFromCentre <= radius) return 1
  return Math.max(0.1, radius / distanceFromCentre)
}

/** Dial readings are kept to a tenth of a degree. */
export const roundReading = (v: number): number => normaliseAxis(Math.round(v * 10) / 10)

/** The new reading after the pointer turns from `fromAxis` to `toAxis` with the given gain. */
export function dragStep(reading: number, fromAxis: number, toAxis: number, gain: number): number {
  return roundReading(reading + wrapAxisDifference(toAxis - fromAxis) * gain)
}

export const distance = (a: Point, b: Point): number => Math.hypot(a.x - b.x, a.y - b.y)

/** Which cell, if any, a point falls in (within the scale's figures). */
export function cellAt(layout: FrameLayout, p: Point): Eye | null {
  for (const eye of ['RE', 'LE'] as const) {
    const c = layout.cells[eye]
    if (distance({ x: c.cx, y: c.cy }, p) <= c.radius * 1.35) return eye
  }
  return null
}

export type DialKeyAction = { kind: 'step', delta: number } | { kind: 'home' } | null

/**
 * Keyboard control of a dial: arrows ±1°, Shift+arrows ±5°, Page Up/Down ±10°,
 * Home back to 90° (no torsion). Up and right turn anticlockwise, the way the scale
 * numbers increase.
 */
export function dialKeyAction(key: string, shift: boolean): DialKeyAction {
  const step = shift ? 5 : 1
  switch (key) {
    // Left and right turn the rod the way the key points as seen on screen: → moves
    // the rod's top end to the right (clockwise, so the figure falls), ← to the left
    // (anticlockwise, the figure rises). Up and down raise and lower the figure.
    case 'ArrowUp':
    case 'ArrowLeft':
      return { kind: 'step', delta: step }
    case 'ArrowDown':
    case 'ArrowRight':
      return { kind: 'step', delta: -step }
    case 'PageUp':
      return { kind: 'step', delta: 10 }
    case 'PageDown':
      return { kind: 'step', delta: -10 }
    case 'Home':
      return { kind: 'home' }
    default:
      return null
  }
}
