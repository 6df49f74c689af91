import { describe, expect, it } from 'vitest'
import { fc, test } from '@fast-check/vitest'
import { discFoveaAngle, foveaFrom, fromFrame, fundusFrame, rotateAbout, tortPoint } from '#shared/engine/fundus/geometry'
import type { Eye } from '#shared/engine/types'

const DISC = { x: 0, y: 0 }
const atanDeg = (v: number) => (Math.atan(v) * 180) / Math.PI

describe('disc–fovea angle: worked examples', () => {
  it('a fovea 0.3 DD below the disc-centre horizontal at 2.6 DD gives about 6.6°, both eyes', () => {
    // Bixenman & von Noorden, Ophthalmology 1982 (fovea ~0.3 DD below the disc centre) and
    // J Korean Ophthalmol Soc 2005;46(10):1684-9 (horizontal 2.59 DD, mean angle 6.26–6.69°)
    const re = discFoveaAngle('RE', DISC, { x: -2.6, y: 0.3 }) // RE: fovea to the viewer's left of the disc
    const le = discFoveaAngle('LE', DISC, { x: 2.6, y: 0.3 }) // LE: to the right
    expect(re).toBeCloseTo(6.58, 2) // atan(0.3 / 2.6) = 6.58°
    expect(le).toBeCloseTo(6.58, 2)
  })

  it('the 2005 mean offsets (2.59 DD across, 0.29 DD down) give an angle within the reported 6.50 ± 2.92°', () => {
    // J Korean Ophthalmol Soc 2005;46(10):1684-9: 2.59 ± 0.26 DD, 0.29 ± 0.14 DD, angle 6.50 ± 2.92°
    const a = discFoveaAngle('RE', DISC, { x: -2.59, y: 0.29 })
    expect(a).toBeCloseTo(atanDeg(0.29 / 2.59), 6)
    expect(Math.abs(a - 6.5)).toBeLessThan(0.2)
  })

  it('the upper 95% fovea position (0.57 DD down) gives about 12.4°', () => {
    // clinical-facts §5 (derived from R47): atan(0.57 / 2.59) = 12.4°
    expect(discFoveaAngle('LE', DISC, { x: 2.59, y: 0.57 })).toBeCloseTo(12.41, 1)
  })

  it('is tan α = vertical / horizontal offset, whatever the unit (pixels or disc diameters)', () => {
    // clinical-facts §5, R45 — the method
    const dd = discFoveaAngle('RE', { x: 5, y: 3 }, { x: 2.4, y: 3.3 })
    const px = discFoveaAngle('RE', { x: 500, y: 300 }, { x: 240, y: 330 })
    expect(px).toBeCloseTo(dd, 9)
  })

  it('is zero with the fovea level with the disc centre and negative above it', () => {
    // domain.md §6: smaller or above the horizontal means incyclotorsion
    expect(discFoveaAngle('RE', DISC, { x: -2.6, y: 0 })).toBeCloseTo(0, 9)
    expect(discFoveaAngle('LE', DISC, { x: 2.6, y: -0.2 })).toBeLessThan(0)
  })

  it('flags marks on the wrong side of the disc (swapped, or the other eye) beyond ±90°', () => {
    expect(Math.abs(discFoveaAngle('RE', DISC, { x: 2.6, y: 0.3 }))).toBeGreaterThan(90)
    expect(Math.abs(discFoveaAngle('LE', DISC, { x: -2.6, y: 0.3 }))).toBeGreaterThan(90)
  })

  it('foveaFrom places the fovea at a given angle and horizontal distance', () => {
    for (const eye of ['RE', 'LE'] as Eye[]) {
      const f = foveaFrom(eye, { x: 3, y: 2 }, 7.5, 2.6)
      expect(Math.abs(f.x - 3)).toBeCloseTo(2.6, 9)
      expect(discFoveaAngle(eye, { x: 3, y: 2 }, f)).toBeCloseTo(7.5, 9)
    }
  })
})

describe('torsion turns the fundus about the fovea', () => {
  const eyeArb = fc.constantFrom<Eye>('RE', 'LE')
  const angleArb = fc.double({ min: -5, max: 15, noNaN: true })
  const horizontalArb = fc.double({ min: 2, max: 3.2, noNaN: true })
  const torsionArb = fc.double({ min: -40, max: 40, noNaN: true })
  const pointArb = fc.record({ x: fc.double({ min: -10, max: 10, noNaN: true }), y: fc.double({ min: -10, max: 10, noNaN: true }) })

  test.prop([eyeArb, angleArb, horizontalArb, torsionArb, pointArb])(
    'the measured angle changes by exactly the torsion, excyclo (+) raising it in both eyes',
    (eye, angle, horizontal, torsion, fovea) => {
      const disc = { x: fovea.x - (foveaFrom(eye, DISC, angle, horizontal).x), y: fovea.y - foveaFrom(eye, DISC, angle, horizontal).y }
      expect(discFoveaAngle(eye, disc, fovea)).toBeCloseTo(angle, 9)
      const torted = tortPoint(eye, disc, fovea, torsion)
      expect(discFoveaAngle(eye, torted, fovea)).toBeCloseTo(angle + torsion, 6)
    },
  )

  test.prop([eyeArb, torsionArb])('excyclotorsion turns the right fundus counter-clockwise and the left clockwise, as the viewer sees them', (eye, torsion) => {
    // domain.md §3.3: excyclo = the top of the eye towards the ear. Seen from in front, the
    // right eye's ear is on the viewer's left, so its 12 o'clock point moves left; the left eye's right.
    fc.pre(Math.abs(torsion) > 0.5)
    const top = tortPoint(eye, { x: 0, y: -1 }, { x: 0, y: 0 }, torsion)
    const towardsEarIsLeft = eye === 'RE'
    const movedLeft = top.x < 0
    expect(movedLeft === towardsEarIsLeft).toBe(torsion > 0)
  })

  test.prop([pointArb, pointArb, fc.double({ min: -180, max: 180, noNaN: true })])('rotation keeps distances and undoes itself', (p, c, deg) => {
    const r = rotateAbout(p, c, deg)
    expect(Math.hypot(r.x - c.x, r.y - c.y)).toBeCloseTo(Math.hypot(p.x - c.x, p.y - c.y), 6)
    const back = rotateAbout(r, c, -deg)
    expect(back.x).toBeCloseTo(p.x, 6)
    expect(back.y).toBeCloseTo(p.y, 6)
  })

  it('the drawing frame turns with the disc and fovea, its v axis towards the inferior retina', () => {
    for (const eye of ['RE', 'LE'] as Eye[]) {
      const disc = { x: 4, y: 3 }
      const fovea = foveaFrom(eye, disc, 6, 2.6)
      const frame = fundusFrame(eye, disc, fovea)
      expect(frame.v.y).toBeGreaterThan(0.9) // inferior = down the picture
      const end = fromFrame(frame, disc, Math.hypot(fovea.x - disc.x, fovea.y - disc.y), 0)
      expect(end.x).toBeCloseTo(fovea.x, 9)
      expect(end.y).toBeCloseTo(fovea.y, 9)
    }
  })
})
