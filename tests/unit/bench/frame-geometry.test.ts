import { describe, expect, it } from 'vitest'
import {
  axisAtPoint,
  cellAt,
  dialKeyAction,
  dragGain,
  dragStep,
  frameLayout,
  polar,
  roundReading,
  scaleTicks,
} from '~~/utils/sim/frame-geometry'

const cell = { cx: 100, cy: 100 }
const close = (a: number, b: number) => expect(a).toBeCloseTo(b, 6)

describe('ISO 8429 dial geometry, seen from in front', () => {
  it('puts 0° at the examiner\'s right, 90° straight up and 180° at the examiner\'s left', () => {
    // ISO 8429:1986 — 0° at the right-hand end of the horizontal (examiner's view), 90° vertical
    const zero = polar(cell, 0, 50)
    close(zero.x, 150)
    close(zero.y, 100)
    const up = polar(cell, 90, 50)
    close(up.x, 100)
    close(up.y, 50)
    const left = polar(cell, 180, 50)
    close(left.x, 50)
    close(left.y, 100)
  })

  it('increases anticlockwise: 45° lies up and to the right', () => {
    // ISO 8429:1986 — angles increase counter-clockwise
    const p = polar(cell, 45, 10)
    expect(p.x).toBeGreaterThan(100)
    expect(p.y).toBeLessThan(100)
  })

  it('reads back the axis pointed at, as an axis (0–180)', () => {
    for (const a of [0, 12.5, 45, 90, 96, 135, 179]) expect(axisAtPoint(cell, polar(cell, a, 40))).toBeCloseTo(a, 6)
    // the lower end of the same axis reads the same axis
    expect(axisAtPoint(cell, polar(cell, 96 + 180, 40))).toBeCloseTo(96, 6)
  })

  it('engraves a tick every 5° and figures every 10° (or 15° on a small frame)', () => {
    const ticks = scaleTicks(10)
    expect(ticks).toHaveLength(37)
    expect(ticks.every(t => t.angle % 5 === 0)).toBe(true)
    expect(ticks.filter(t => t.figure).map(t => t.angle)).toEqual([0, 10, 20, 30, 40, 50, 60, 70, 80, 90, 100, 110, 120, 130, 140, 150, 160, 170, 180])
    expect(scaleTicks(15).filter(t => t.figure).map(t => Number(t.figure))).toEqual([0, 15, 30, 45, 60, 75, 90, 105, 120, 135, 150, 165, 180])
  })

  it('draws the right eye\'s cell on the examiner\'s left', () => {
    const layout = frameLayout(800)
    expect(layout.cells.RE.cx).toBeLessThan(layout.cells.LE.cx)
    expect(cellAt(layout, { x: layout.cells.RE.cx + 5, y: layout.cells.RE.cy })).toBe('RE')
    expect(cellAt(layout, { x: layout.cells.LE.cx, y: layout.cells.LE.cy - 10 })).toBe('LE')
    expect(cellAt(layout, { x: layout.width / 2, y: 2 })).toBeNull()
  })

  it('keeps figures every 10° on a wide frame and every 15° on a narrow one', () => {
    expect(frameLayout(800).figureStep).toBe(10)
    expect(frameLayout(360).figureStep).toBe(15)
  })

  it('keeps both rims inside the canvas and apart from each other', () => {
    for (const w of [320, 640, 800, 1200]) {
      const l = frameLayout(w)
      const rim = l.cells.RE.radius * 1.34
      expect(l.cells.RE.cx - rim).toBeGreaterThan(0)
      expect(l.cells.LE.cx + rim).toBeLessThan(w)
      expect(l.cells.RE.cx + rim).toBeLessThan(l.cells.LE.cx - rim)
      expect(l.cells.RE.cy - rim).toBeGreaterThan(0)
      expect(l.cells.RE.cy + rim).toBeLessThan(l.height)
    }
  })
})

describe('dragging a dial', () => {
  it('follows the pointer inside the scale and turns more finely further out', () => {
    expect(dragGain(10, 100)).toBe(1)
    expect(dragGain(100, 100)).toBe(1)
    expect(dragGain(200, 100)).toBe(0.5)
    expect(dragGain(400, 100)).toBe(0.25)
    expect(dragGain(5000, 100)).toBe(0.1)
  })

  it('turns by the pointer\'s change of angle times the gain, across 0/180', () => {
    expect(dragStep(90, 90, 100, 1)).toBe(100)
    expect(dragStep(90, 90, 100, 0.5)).toBe(95)
    expect(dragStep(90, 100, 90, 0.25)).toBe(87.5)
    // from 178° on past 180° wraps to the start of the scale
    expect(dragStep(178, 178, 3, 1)).toBe(3)
    expect(dragStep(2, 2, 177, 1)).toBe(177)
  })

  it('keeps readings to a tenth of a degree within 0–180', () => {
    expect(roundReading(96.04)).toBe(96)
    expect(roundReading(96.06)).toBe(96.1)
    expect(roundReading(180)).toBe(0)
    expect(roundReading(-1)).toBe(179)
  })
})

describe('keyboard control', () => {
  it('moves 1° with the arrows, 5° with Shift, and returns to 90° with Home', () => {
    expect(dialKeyAction('ArrowUp', false)).toEqual({ kind: 'step', delta: 1 })
    // → turns the rod's top to the right as seen on screen: clockwise, and the ISO 8429
    // figures rise anticlockwise, so the figure falls; ← the other way
    expect(dialKeyAction('ArrowRight', false)).toEqual({ kind: 'step', delta: -1 })
    expect(dialKeyAction('ArrowLeft', false)).toEqual({ kind: 'step', delta: 1 })
    expect(dialKeyAction('ArrowDown', false)).toEqual({ kind: 'step', delta: -1 })
    expect(dialKeyAction('ArrowLeft', true)).toEqual({ kind: 'step', delta: 5 })
    expect(dialKeyAction('ArrowUp', true)).toEqual({ kind: 'step', delta: 5 })
    expect(dialKeyAction('Home', false)).toEqual({ kind: 'home' })
    expect(dialKeyAction('a', false)).toBeNull()
    expect(dialKeyAction('Tab', false)).toBeNull()
  })
})
