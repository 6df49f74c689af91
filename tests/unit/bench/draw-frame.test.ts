import { describe, expect, it } from 'vitest'
import { drawFrameRods, drawFrameStatic } from '~~/utils/sim/draw-frame'
import { frameLayout, polar } from '~~/utils/sim/frame-geometry'
import { recordingContext } from '~~/tests/support/canvas'

const near = (p: { x: number, y: number }, q: { x: number, y: number }) => Math.hypot(p.x - q.x, p.y - q.y) < 1e-6

describe('drawing the trial frame', () => {
  const layout = frameLayout(800)

  it('draws each rod\'s index hairline out to the scale along its reading', () => {
    const rec = recordingContext()
    drawFrameRods(rec.ctx, { layout, readings: { RE: 104, LE: 81.5 }, turnable: true, active: null })
    const tips = rec.lineTos()
    for (const [eye, reading] of [['RE', 104], ['LE', 81.5]] as const) {
      const cell = layout.cells[eye]
      const tip = polar(cell, reading, cell.radius * 1.1)
      expect(tips.some(t => near(t, tip)), `${eye} index at ${reading}°`).toBe(true)
      // and nowhere near 90°, where an untouched rod would point
      expect(tips.some(t => near(t, polar(cell, 90, cell.radius * 1.1)))).toBe(false)
    }
  })

  it('engraves 37 ticks and 19 figures per cell, and labels nose and ear sides per eye', () => {
    const rec = recordingContext()
    drawFrameStatic(rec.ctx, layout)
    const texts = rec.calls.filter(c => c.fn === 'fillText').map(c => c.args[0] as string)
    expect(texts.filter(t => /^\d+$/.test(t))).toHaveLength(2 * 19)
    expect(texts).toContain('RE · right eye')
    expect(texts).toContain('LE · left eye')
    // RE: the 0° end (examiner's right) is the patient's nose; LE: it is the ear
    const label = (t: string) => rec.calls.filter(c => c.fn === 'fillText' && c.args[0] === t).map(c => c.args[1] as number)
    const [noseRe, noseLe] = label('nose')
    expect(noseRe).toBeGreaterThan(layout.cells.RE.cx)
    expect(noseLe).toBeLessThan(layout.cells.LE.cx)
  })

  it('draws the grip only when the learner turns the rods', () => {
    const count = (turnable: boolean) => {
      const rec = recordingContext()
      drawFrameRods(rec.ctx, { layout, readings: { RE: 90, LE: 90 }, turnable, active: null })
      return rec.calls.filter(c => c.fn === 'arc').length
    }
    expect(count(true) - count(false)).toBe(2)
  })
})
