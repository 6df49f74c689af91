// Draws the learner's marks on a fundus picture: the horizontal through the disc
// centre, the disc-centre-to-fovea line, the angle between them and its value.
// Works in CSS pixels; the caller converts picture units first. Disc centre is a
// ringed cross, fovea a diamond, so the two differ by shape as well as colour.
import type { Point } from '#shared/engine/fundus/geometry'

export interface OverlayMarks {
  disc: Point | null
  fovea: Point | null
  active: 'disc' | 'fovea'
  /** Degrees, when both marks are placed. */
  angle: number | null
  /** x direction from disc to fovea: −1 on a right eye, +1 on a left eye. */
  temporal: 1 | -1
}

function outlined(ctx: CanvasRenderingContext2D, draw: () => void, colour: string, width: number) {
  ctx.strokeStyle = 'rgba(0, 0, 0, 0.75)'
  ctx.lineWidth = width + 2
  draw()
  ctx.strokeStyle = colour
  ctx.lineWidth = width
  draw()
}

const DISC_COLOUR = '#d4ecec'
const FOVEA_COLOUR = '#f3e3c2'

export function paintOverlay(ctx: CanvasRenderingContext2D, width: number, m: OverlayMarks) {
  const { disc, fovea } = m
  if (disc) {
    ctx.setLineDash([6, 5])
    outlined(ctx, () => {
      ctx.beginPath()
      ctx.moveTo(0, disc.y)
      ctx.lineTo(width, disc.y)
      ctx.stroke()
    }, 'rgba(255, 255, 255, 0.9)', 1.5)
    ctx.setLineDash([])
  }
  if (disc && fovea) {
    const dx = fovea.x - disc.x
    const dy = fovea.y - disc.y
    outlined(ctx, () => {
      ctx.beginPath()
      ctx.moveTo(disc.x, disc.y)
      ctx.lineTo(disc.x + dx * 1.15, disc.y + dy * 1.15)
      ctx.stroke()
    }, FOVEA_COLOUR, 2)
    if (m.angle !== null && Math.abs(m.angle) <= 90) {
      const r = Math.min(70, Math.hypot(dx, dy) * 0.6)
      // from the temporal half of the horizontal to the line; canvas angles run clockwise
      const start = m.temporal === 1 ? 0 : Math.PI
      const sweep = m.temporal * (m.angle * Math.PI / 180)
      outlined(ctx, () => {
        ctx.beginPath()
        ctx.arc(disc.x, disc.y, r, start, start + sweep, sweep < 0)
        ctx.stroke()
      }, '#ffd9de', 1.5)
      const label = `${m.angle.toFixed(1)}°`
      ctx.font = 'bold 15px "Atkinson Hyperlegible", system-ui, sans-serif'
      const tx = disc.x + m.temporal * (r + 10) - (m.temporal === -1 ? ctx.measureText(label).width : 0)
      const ty = disc.y + (m.angle >= 0 ? 18 : -8)
      ctx.lineWidth = 4
      ctx.strokeStyle = 'rgba(0, 0, 0, 0.8)'
      ctx.strokeText(label, tx, ty)
      ctx.fillStyle = '#ffffff'
      ctx.fillText(label, tx, ty)
    }
  }
  if (disc) {
    const size = m.active === 'disc' ? 11 : 9
    outlined(ctx, () => {
      ctx.beginPath()
      ctx.arc(disc.x, disc.y, size, 0, Math.PI * 2)
      ctx.moveTo(disc.x - size - 5, disc.y)
      ctx.lineTo(disc.x + size + 5, disc.y)
      ctx.moveTo(disc.x, disc.y - size - 5)
      ctx.lineTo(disc.x, disc.y + size + 5)
      ctx.stroke()
    }, DISC_COLOUR, m.active === 'disc' ? 2.5 : 1.5)
  }
  if (fovea) {
    const size = m.active === 'fovea' ? 11 : 9
    outlined(ctx, () => {
      ctx.beginPath()
      ctx.moveTo(fovea.x, fovea.y - size)
      ctx.lineTo(fovea.x + size, fovea.y)
      ctx.lineTo(fovea.x, fovea.y + size)
      ctx.lineTo(fovea.x - size, fovea.y)
      ctx.closePath()
      ctx.stroke()
    }, FOVEA_COLOUR, m.active === 'fovea' ? 2.5 : 1.5)
    ctx.fillStyle = FOVEA_COLOUR
    ctx.fillRect(fovea.x - 1, fovea.y - 1, 2, 2)
  }
}
