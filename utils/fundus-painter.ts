// Paints a procedural fundus (shared/engine/fundus/scene.ts) on a 2D canvas. The
// context arrives already scaled so that one unit is one disc diameter. Colours
// are the photograph's own (an orange-red fundus, pale disc, dark macula), not
// interface tokens.
import type { FundusPicture } from '#shared/engine/fundus/picture'
import type { FundusScene, Vessel } from '#shared/engine/fundus/scene'

const mix = (a: number[], b: number[], t: number) => a.map((v, i) => Math.round(v + (b[i]! - v) * t))
const rgb = (c: number[], alpha = 1) => `rgba(${c[0]}, ${c[1]}, ${c[2]}, ${alpha})`

/** A soft round patch: a radial gradient through `stops` ([offset, colour]), filled as a circle. */
function blot(ctx: CanvasRenderingContext2D, x: number, y: number, r: number, stops: [number, string][]) {
  const g = ctx.createRadialGradient(x, y, 0, x, y, r)
  for (const [at, colour] of stops) g.addColorStop(at, colour)
  ctx.fillStyle = g
  ctx.beginPath()
  ctx.arc(x, y, r, 0, Math.PI * 2)
  ctx.fill()
}

const LIGHT_FUNDUS = [222, 108, 52]
const DARK_FUNDUS = [150, 56, 28]

function paintVessel(ctx: CanvasRenderingContext2D, v: Vessel) {
  const colour = v.kind === 'vein' ? 'rgba(108, 22, 16, 0.92)' : 'rgba(176, 50, 30, 0.9)'
  const n = v.points.length
  ctx.lineCap = 'round'
  ctx.lineJoin = 'round'
  ctx.strokeStyle = colour
  for (let i = 1; i < n; i++) {
    const a = v.points[i - 1]!
    const b = v.points[i]!
    ctx.lineWidth = v.width * (1 - 0.65 * (i / n))
    ctx.beginPath()
    ctx.moveTo(a.x, a.y)
    ctx.lineTo(b.x, b.y)
    ctx.stroke()
  }
  if (v.kind === 'artery' && v.from === 'disc') {
    // the bright central reflex of an artery wall
    ctx.strokeStyle = 'rgba(255, 196, 160, 0.35)'
    ctx.lineWidth = v.width * 0.22
    ctx.beginPath()
    v.points.forEach((p, i) => (i ? ctx.lineTo(p.x, p.y) : ctx.moveTo(p.x, p.y)))
    ctx.stroke()
  }
}

export function paintFundus(ctx: CanvasRenderingContext2D, picture: FundusPicture, scene: FundusScene) {
  const { field, frame } = picture
  ctx.fillStyle = '#050505'
  ctx.fillRect(0, 0, frame.width, frame.height)
  ctx.save()
  ctx.beginPath()
  ctx.arc(field.x, field.y, field.radius, 0, Math.PI * 2)
  ctx.clip()

  const base = mix(LIGHT_FUNDUS, DARK_FUNDUS, scene.pigment)
  const ground = ctx.createRadialGradient(field.x, field.y, 0.3, field.x, field.y, field.radius)
  ground.addColorStop(0, rgb(mix(base, [240, 140, 80], 0.25)))
  ground.addColorStop(0.75, rgb(base))
  ground.addColorStop(1, rgb(mix(base, [40, 10, 5], 0.55)))
  ctx.fillStyle = ground
  ctx.fillRect(0, 0, frame.width, frame.height)

  // soft-edged blotches: the choroid showing through the pigment epithelium
  for (const m of scene.mottles) blot(ctx, m.x, m.y, m.r, [[0, m.light ? 'rgba(255, 170, 110, 0.07)' : 'rgba(90, 24, 8, 0.08)'], [1, 'rgba(0, 0, 0, 0)']])

  const mac = scene.macula
  blot(ctx, mac.x, mac.y, mac.radius, [[0, 'rgba(70, 18, 6, 0.55)'], [0.35, 'rgba(90, 24, 8, 0.35)'], [1, 'rgba(90, 24, 8, 0)']])

  const d = scene.disc
  ctx.save()
  ctx.translate(d.x, d.y)
  ctx.rotate(d.rotation)
  const rim = ctx.createRadialGradient(0, 0, 0, 0, 0, Math.max(d.rx, d.ry))
  rim.addColorStop(0, 'rgb(255, 236, 196)')
  rim.addColorStop(0.7, 'rgb(246, 196, 140)')
  rim.addColorStop(1, 'rgba(236, 160, 104, 0.9)')
  ctx.fillStyle = rim
  ctx.beginPath()
  ctx.ellipse(0, 0, d.rx, d.ry, 0, 0, Math.PI * 2)
  ctx.fill()
  ctx.fillStyle = 'rgba(255, 248, 228, 0.75)'
  ctx.beginPath()
  ctx.ellipse(d.rx * 0.12, 0, d.rx * d.cup * 1.4, d.ry * d.cup * 1.4, 0, 0, Math.PI * 2)
  ctx.fill()
  ctx.restore()

  for (const v of scene.vessels.filter(v => v.kind === 'vein')) paintVessel(ctx, v)
  for (const v of scene.vessels.filter(v => v.kind === 'artery')) paintVessel(ctx, v)

  const f = scene.fovea
  blot(ctx, f.x, f.y, 0.12, [[0, 'rgba(52, 12, 4, 0.75)'], [1, 'rgba(52, 12, 4, 0)']])
  ctx.fillStyle = 'rgba(255, 236, 214, 0.75)'
  ctx.beginPath()
  ctx.arc(f.x, f.y, 0.022, 0, Math.PI * 2)
  ctx.fill()

  ctx.restore()
}
