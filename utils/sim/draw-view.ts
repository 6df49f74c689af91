// Draws what the virtual patient sees: two streaks of light in a dim room (or a
// lit room whose edges give orientation cues), each through the image of the
// fixation light, at the tilt the patient perceives.

import type { Ctx2d } from './draw-frame'
import { PALETTE, withAlpha } from './palette'
import type { DrawnStreak, DrawnView } from './view-geometry'
import { pxPerDioptre, streakSegment } from './view-geometry'

export interface ViewDrawModel {
  width: number
  height: number
  view: DrawnView | null
  /** Colour-blind aid: draw each streak in its own pattern and name it. */
  patterned: boolean
}

const STREAK_COLOUR = { red: PALETTE.red, white: PALETTE.white } as const

function drawRoom(ctx: Ctx2d, w: number, h: number, lit: boolean) {
  ctx.fillStyle = lit ? PALETTE.paperSunk : PALETTE.night
  ctx.fillRect(0, 0, w, h)
  if (lit) {
    // a window and the floor line: the room's verticals and horizontals the patient can lean on
    ctx.strokeStyle = PALETTE.lineStrong
    ctx.lineWidth = 2
    ctx.beginPath()
    ctx.roundRect(w * 0.06, h * 0.12, w * 0.2, h * 0.42, 3)
    ctx.moveTo(w * 0.16, h * 0.12)
    ctx.lineTo(w * 0.16, h * 0.54)
    ctx.moveTo(0, h * 0.86)
    ctx.lineTo(w, h * 0.86)
    ctx.moveTo(w * 0.8, h * 0.86)
    ctx.lineTo(w * 0.8, h * 0.2)
    ctx.lineTo(w * 0.93, h * 0.2)
    ctx.lineTo(w * 0.93, h * 0.86)
    ctx.stroke()
  }
  // level marks on the bezel, for the learner (the patient has none in the dark)
  ctx.strokeStyle = lit ? PALETTE.inkFaint : withAlpha(PALETTE.white, 0.35)
  ctx.lineWidth = 1
  ctx.beginPath()
  for (const x of [0, w]) {
    const dir = x === 0 ? 1 : -1
    ctx.moveTo(x, h / 2)
    ctx.lineTo(x + dir * 14, h / 2)
  }
  ctx.stroke()
}

function drawStreak(ctx: Ctx2d, s: DrawnStreak, w: number, h: number, lit: boolean, patterned: boolean) {
  const seg = streakSegment(s, w, h)
  const colour = STREAK_COLOUR[s.colour]
  const dashed = patterned && s.pattern === 'dashed'
  const core = lit ? (s.colour === 'white' ? PALETTE.inkSoft : PALETTE.red) : colour
  // a soft glow, drawn as a wide translucent line (cheaper than a shadow blur)
  ctx.lineCap = 'round'
  ctx.setLineDash(dashed ? [18, 10] : [])
  ctx.strokeStyle = withAlpha(s.colour === 'red' ? PALETTE.red : PALETTE.white, lit ? 0.12 : 0.28)
  ctx.lineWidth = 9
  ctx.beginPath()
  ctx.moveTo(seg.from.x, seg.from.y)
  ctx.lineTo(seg.to.x, seg.to.y)
  ctx.stroke()
  ctx.strokeStyle = core
  ctx.lineWidth = 2.5
  ctx.globalAlpha = lit ? 0.55 : 1
  ctx.stroke()
  ctx.globalAlpha = 1
  ctx.setLineDash([])
  // the image of the fixation light, brightest where the streak crosses it
  ctx.fillStyle = lit ? withAlpha(core, 0.6) : PALETTE.glow
  ctx.beginPath()
  ctx.arc(seg.centre.x, seg.centre.y, 4, 0, Math.PI * 2)
  ctx.fill()
  if (patterned) {
    const tagX = Math.min(w - 36, Math.max(36, seg.centre.x + w * 0.3))
    const dy = Math.tan((s.angle * Math.PI) / 180) * (tagX - seg.centre.x)
    ctx.font = 'bold 12px "Atkinson Hyperlegible", system-ui, sans-serif'
    ctx.textAlign = 'center'
    ctx.textBaseline = 'bottom'
    ctx.fillStyle = lit ? PALETTE.ink : PALETTE.white
    ctx.fillText(`${s.colour}${dashed ? ' (dashed)' : ''}`, tagX, seg.centre.y - dy - 8)
  }
}

export function drawPatientView(ctx: Ctx2d, model: ViewDrawModel) {
  const { width: w, height: h, view } = model
  const lit = view?.lights === 'on'
  ctx.clearRect(0, 0, w, h)
  drawRoom(ctx, w, h, lit)
  if (!view) return
  for (const eye of ['LE', 'RE'] as const) {
    const s = view.streaks[eye]
    if (s.visible) drawStreak(ctx, s, w, h, lit, model.patterned)
  }
}

/** Vertical distance between the streak centres in pixels (for tests and captions). */
export const separationPx = (view: DrawnView, width: number): number =>
  Math.abs(view.streaks.RE.offset.y - view.streaks.LE.offset.y) * pxPerDioptre(width)
