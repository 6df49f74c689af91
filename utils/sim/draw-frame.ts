// Draws the trial frame seen from in front. The engraved parts (frame, scales,
// figures) change only with the size, so they are painted once into a layer and
// copied; each redraw while dragging paints just the two rods and their indices.

import type { Eye, PerEye } from '#shared/engine/types'
import { zeroEndSide } from '#shared/engine/dial'
import type { CellLayout, FrameLayout } from './frame-geometry'
import { polar, scaleTicks } from './frame-geometry'
import { PALETTE, withAlpha } from './palette'

/** The subset of CanvasRenderingContext2D the drawing uses (a recording fake serves in tests). */
export type Ctx2d = Pick<
  CanvasRenderingContext2D,
  | 'save' | 'restore' | 'beginPath' | 'closePath' | 'moveTo' | 'lineTo' | 'arc' | 'fill' | 'stroke' | 'clip'
  | 'fillText' | 'clearRect' | 'fillRect' | 'setLineDash' | 'drawImage' | 'setTransform' | 'roundRect'
> & {
  fillStyle: CanvasRenderingContext2D['fillStyle']
  strokeStyle: CanvasRenderingContext2D['strokeStyle']
  lineWidth: number
  lineCap: CanvasLineCap
  font: string
  textAlign: CanvasTextAlign
  textBaseline: CanvasTextBaseline
  globalAlpha: number
}

/** What one redraw needs: the layout and where each rod's axis points. */
export interface FrameDrawModel {
  layout: FrameLayout
  readings: PerEye<number>
  /** Dials the learner may turn are drawn with a grip. */
  turnable: boolean
  /** Cell whose dial has keyboard focus or is being dragged. */
  active: Eye | null
}

/** Glass tint of each rod: the red rod before the right eye, the white before the left. */
const ROD_GLASS: Record<Eye, { fill: string, groove: string }> = {
  RE: { fill: withAlpha(PALETTE.red, 0.34), groove: withAlpha(PALETTE.red, 0.75) },
  LE: { fill: withAlpha(PALETTE.lineStrong, 0.16), groove: withAlpha(PALETTE.inkSoft, 0.45) },
}

const EYE_LABEL: Record<Eye, string> = { RE: 'RE · right eye', LE: 'LE · left eye' }

function circle(ctx: Ctx2d, x: number, y: number, r: number) {
  ctx.beginPath()
  ctx.arc(x, y, r, 0, Math.PI * 2)
}

function drawCellStatic(ctx: Ctx2d, cell: CellLayout, figureStep: 10 | 15) {
  const { cx, cy, radius: R, aperture } = cell
  // the rim carrying the scale
  circle(ctx, cx, cy, R * 1.34)
  ctx.fillStyle = PALETTE.paperSunk
  ctx.fill()
  ctx.lineWidth = 1.5
  ctx.strokeStyle = PALETTE.lineStrong
  ctx.stroke()
  // the ring in which the rod turns
  circle(ctx, cx, cy, R * 0.97)
  ctx.fillStyle = PALETTE.ink
  ctx.fill()
  circle(ctx, cx, cy, aperture)
  ctx.fillStyle = PALETTE.paperRaised
  ctx.fill()

  // engraved scale: ticks every 5°, longer where a figure is engraved
  const fontPx = Math.max(9, Math.round(R * 0.095))
  ctx.strokeStyle = PALETTE.ink
  ctx.fillStyle = PALETTE.ink
  ctx.font = `${fontPx}px "JetBrains Mono", ui-monospace, monospace`
  ctx.textAlign = 'center'
  ctx.textBaseline = 'middle'
  for (const t of scaleTicks(figureStep)) {
    const inner = polar(cell, t.angle, t.long ? R * 1.0 : R * 1.04)
    const outer = polar(cell, t.angle, R * 1.1)
    ctx.lineWidth = t.long ? 1.4 : 1
    ctx.beginPath()
    ctx.moveTo(inner.x, inner.y)
    ctx.lineTo(outer.x, outer.y)
    ctx.stroke()
    if (t.figure) {
      const at = polar(cell, t.angle, R * 1.21)
      ctx.fillText(t.figure, at.x, at.y)
    }
  }
  // which end of the horizontal is nose and which is ear, for this eye
  const small = Math.max(9, Math.round(fontPx * 0.9))
  ctx.font = `${small}px "Atkinson Hyperlegible", system-ui, sans-serif`
  ctx.fillStyle = PALETTE.inkSoft
  const zeroSide = zeroEndSide(cell.eye) === 'nasal' ? 'nose' : 'ear'
  const otherSide = zeroSide === 'nose' ? 'ear' : 'nose'
  const right = polar(cell, -9, R * 1.2)
  const left = polar(cell, 189, R * 1.2)
  ctx.fillText(zeroSide, right.x, right.y)
  ctx.fillText(otherSide, left.x, left.y)
  // the eye's name on the lower rim, where there is no scale
  ctx.font = `bold ${small}px "Atkinson Hyperlegible", system-ui, sans-serif`
  ctx.fillStyle = PALETTE.ink
  const label = polar(cell, 270, R * 1.18)
  ctx.fillText(EYE_LABEL[cell.eye], label.x, label.y)
}

/** The frame body and both cells' scales: drawn once per size. */
export function drawFrameStatic(ctx: Ctx2d, layout: FrameLayout) {
  const { RE, LE } = layout.cells
  // the bridge joining the two cells
  ctx.fillStyle = PALETTE.inkSoft
  ctx.beginPath()
  ctx.roundRect(RE.cx, RE.cy - RE.radius * 0.16, LE.cx - RE.cx, RE.radius * 0.2, RE.radius * 0.08)
  ctx.fill()
  drawCellStatic(ctx, RE, layout.figureStep)
  drawCellStatic(ctx, LE, layout.figureStep)
}

/** One rod, its axis index and (when the learner turns it) its grip. */
export function drawRod(ctx: Ctx2d, cell: CellLayout, reading: number, turnable: boolean, active: boolean) {
  const { cx, cy, radius: R, aperture } = cell
  const glass = ROD_GLASS[cell.eye]
  ctx.save()
  circle(ctx, cx, cy, aperture)
  ctx.fillStyle = glass.fill
  ctx.fill()
  ctx.clip()
  // the cylinders run along the rod axis
  ctx.strokeStyle = glass.groove
  const spacing = Math.max(5, aperture / 8)
  const normal = reading + 90
  for (let k = -8; k <= 8; k++) {
    const mid = polar(cell, normal, k * spacing)
    const a = polar({ cx: mid.x, cy: mid.y }, reading, aperture)
    const b = polar({ cx: mid.x, cy: mid.y }, reading + 180, aperture)
    ctx.lineWidth = k % 2 === 0 ? 1.6 : 0.8
    ctx.beginPath()
    ctx.moveTo(a.x, a.y)
    ctx.lineTo(b.x, b.y)
    ctx.stroke()
  }
  ctx.restore()

  // the index along the rod axis: a hairline reaching into the scale, with a pointer
  const tail = polar(cell, reading + 180, aperture * 0.95)
  const tip = polar(cell, reading, R * 1.1)
  ctx.strokeStyle = active ? PALETTE.brassDark : PALETTE.brass
  ctx.lineCap = 'round'
  ctx.lineWidth = 2.5
  ctx.beginPath()
  const head = polar(cell, reading, R * 0.94)
  ctx.moveTo(tail.x, tail.y)
  ctx.lineTo(head.x, head.y)
  ctx.stroke()
  // a fine red hairline across the ticks, for reading the scale closely
  const hair = polar(cell, reading, R * 0.9)
  ctx.lineWidth = 1
  ctx.strokeStyle = PALETTE.bad
  ctx.beginPath()
  ctx.moveTo(hair.x, hair.y)
  ctx.lineTo(tip.x, tip.y)
  ctx.stroke()
  // pointer triangle just inside the scale
  const p0 = polar(cell, reading, R * 0.97)
  const p1 = polar(cell, reading + 3.2, R * 0.86)
  const p2 = polar(cell, reading - 3.2, R * 0.86)
  ctx.fillStyle = active ? PALETTE.brassDark : PALETTE.brass
  ctx.beginPath()
  ctx.moveTo(p0.x, p0.y)
  ctx.lineTo(p1.x, p1.y)
  ctx.lineTo(p2.x, p2.y)
  ctx.closePath()
  ctx.fill()

  if (turnable) {
    // the grip on the lower arm of the rod, where the scale leaves room for a finger
    const grip = polar(cell, reading + 180, aperture * 0.7)
    circle(ctx, grip.x, grip.y, Math.max(7, R * 0.085))
    ctx.fillStyle = active ? PALETTE.brassDark : PALETTE.brass
    ctx.fill()
    ctx.lineWidth = 1.5
    ctx.strokeStyle = PALETTE.paperRaised
    ctx.stroke()
  }
  circle(ctx, cx, cy, Math.max(3, R * 0.035))
  ctx.fillStyle = PALETTE.ink
  ctx.fill()
}

export function drawFrameRods(ctx: Ctx2d, model: FrameDrawModel) {
  for (const eye of ['RE', 'LE'] as const) {
    drawRod(ctx, model.layout.cells[eye], model.readings[eye], model.turnable, model.active === eye)
  }
}
