// A generated fundus picture as pixels, drawn on the server: the same scene
// (shared/engine/fundus/scene.ts) the browser's painter (utils/fundus-painter.ts)
// draws, written as SVG and rasterised with sharp. A quiz item sends these pixels
// instead of the picture's geometry, so during a sitting the browser never holds the
// disc and fovea coordinates (or the look key) — the learner must measure the picture.
// Keep the colours and shapes in step with the painter.
import sharp from 'sharp'
import type { FundusPicture } from '#shared/engine/fundus/picture'
import type { FundusScene, Vessel } from '#shared/engine/fundus/scene'
import { fundusScene } from '#shared/engine/fundus/scene'

/** Pixels per disc diameter: an 8 × 6 DD picture becomes 800 × 600. */
export const FUNDUS_PX_PER_DD = 100

const LIGHT_FUNDUS = [222, 108, 52]
const DARK_FUNDUS = [150, 56, 28]
const mix = (a: number[], b: number[], t: number) => a.map((v, i) => Math.round(v + (b[i]! - v) * t))
const rgb = (c: number[]) => `rgb(${c[0]},${c[1]},${c[2]})`
const n = (v: number) => Number(v.toFixed(4))

/** A gradient stop: offset 0–1, colour [r, g, b], opacity. */
const stop = (offset: number, c: number[], opacity = 1) => `<stop offset="${n(offset)}" stop-color="${rgb(c)}" stop-opacity="${opacity}"/>`

function vesselSvg(v: Vessel): string {
  const colour = v.kind === 'vein' ? 'stroke="rgb(108,22,16)" stroke-opacity="0.92"' : 'stroke="rgb(176,50,30)" stroke-opacity="0.9"'
  const count = v.points.length
  const out: string[] = []
  for (let i = 1; i < count; i++) {
    const a = v.points[i - 1]!
    const b = v.points[i]!
    out.push(`<line x1="${n(a.x)}" y1="${n(a.y)}" x2="${n(b.x)}" y2="${n(b.y)}" stroke-width="${n(v.width * (1 - 0.65 * (i / count)))}" ${colour}/>`)
  }
  if (v.kind === 'artery' && v.from === 'disc') {
    // the bright central reflex of an artery wall
    out.push(`<polyline points="${v.points.map(p => `${n(p.x)},${n(p.y)}`).join(' ')}" fill="none" stroke="rgb(255,196,160)" stroke-opacity="0.35" stroke-width="${n(v.width * 0.22)}"/>`)
  }
  return out.join('')
}

/** The SVG of one eye's picture, in disc-diameter units scaled to `pxPerUnit`. */
export function fundusSvg(picture: FundusPicture, scene: FundusScene = fundusScene(picture), pxPerUnit = FUNDUS_PX_PER_DD): string {
  const { field, frame } = picture
  const base = mix(LIGHT_FUNDUS, DARK_FUNDUS, scene.pigment)
  const inner = 0.3 / field.radius
  const d = scene.disc
  const discR = Math.max(d.rx, d.ry)
  const f = scene.fovea
  const m = scene.macula
  const width = Math.round(frame.width * pxPerUnit)
  const height = Math.round(frame.height * pxPerUnit)
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${frame.width} ${frame.height}">
<defs>
<clipPath id="field"><circle cx="${n(field.x)}" cy="${n(field.y)}" r="${n(field.radius)}"/></clipPath>
<radialGradient id="ground" gradientUnits="userSpaceOnUse" cx="${n(field.x)}" cy="${n(field.y)}" r="${n(field.radius)}">${stop(inner, mix(base, [240, 140, 80], 0.25))}${stop(inner + (1 - inner) * 0.75, base)}${stop(1, mix(base, [40, 10, 5], 0.55))}</radialGradient>
<radialGradient id="mottle-light">${stop(0, [255, 170, 110], 0.07)}${stop(1, [0, 0, 0], 0)}</radialGradient>
<radialGradient id="mottle-dark">${stop(0, [90, 24, 8], 0.08)}${stop(1, [0, 0, 0], 0)}</radialGradient>
<radialGradient id="macula">${stop(0, [70, 18, 6], 0.55)}${stop(0.35, [90, 24, 8], 0.35)}${stop(1, [90, 24, 8], 0)}</radialGradient>
<radialGradient id="rim" gradientUnits="userSpaceOnUse" cx="0" cy="0" r="${n(discR)}">${stop(0, [255, 236, 196])}${stop(0.7, [246, 196, 140])}${stop(1, [236, 160, 104], 0.9)}</radialGradient>
<radialGradient id="fovea">${stop(0, [52, 12, 4], 0.75)}${stop(1, [52, 12, 4], 0)}</radialGradient>
</defs>
<rect width="${frame.width}" height="${frame.height}" fill="#050505"/>
<g clip-path="url(#field)">
<rect width="${frame.width}" height="${frame.height}" fill="url(#ground)"/>
${scene.mottles.map(s => `<circle cx="${n(s.x)}" cy="${n(s.y)}" r="${n(s.r)}" fill="url(#mottle-${s.light ? 'light' : 'dark'})"/>`).join('')}
<circle cx="${n(m.x)}" cy="${n(m.y)}" r="${n(m.radius)}" fill="url(#macula)"/>
<g transform="translate(${n(d.x)} ${n(d.y)}) rotate(${n(d.rotation * 180 / Math.PI)})">
<ellipse cx="0" cy="0" rx="${n(d.rx)}" ry="${n(d.ry)}" fill="url(#rim)"/>
<ellipse cx="${n(d.rx * 0.12)}" cy="0" rx="${n(d.rx * d.cup * 1.4)}" ry="${n(d.ry * d.cup * 1.4)}" fill="rgb(255,248,228)" fill-opacity="0.75"/>
</g>
<g stroke-linecap="round" stroke-linejoin="round" fill="none">
${scene.vessels.filter(v => v.kind === 'vein').map(vesselSvg).join('')}
${scene.vessels.filter(v => v.kind === 'artery').map(vesselSvg).join('')}
</g>
<circle cx="${n(f.x)}" cy="${n(f.y)}" r="0.12" fill="url(#fovea)"/>
<circle cx="${n(f.x)}" cy="${n(f.y)}" r="0.022" fill="rgb(255,236,214)" fill-opacity="0.75"/>
</g>
</svg>`
}

// A few recent pictures kept rendered: a sitting asks for the same eyes on every reload.
const rendered = new Map<string, Promise<Buffer>>()
const KEEP = 64

/** The picture as a PNG (no metadata). Same picture → same bytes. */
export function renderFundusPng(picture: FundusPicture, pxPerUnit = FUNDUS_PX_PER_DD): Promise<Buffer> {
  const key = JSON.stringify([picture, pxPerUnit])
  const hit = rendered.get(key)
  if (hit) return hit
  const png = sharp(Buffer.from(fundusSvg(picture, fundusScene(picture), pxPerUnit))).png({ compressionLevel: 8 }).toBuffer()
  rendered.set(key, png)
  png.catch(() => rendered.delete(key))
  if (rendered.size > KEEP) rendered.delete(rendered.keys().next().value!)
  return png
}
