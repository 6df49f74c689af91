import { describe, expect, it } from 'vitest'
import { buildView } from '#shared/engine/view'
import type { ViewSource } from '#shared/engine/view'
import { describeView } from '#shared/engine/words'
import type { Presentation } from '#shared/engine/presentation'
import { drawnFromReport, drawnFromView, pxPerDioptre, streakSegment, VIEW_ASPECT } from '~~/utils/sim/view-geometry'

const source: ViewSource = {
  horizontalAt: { RE: 96, LE: 90 },
  alignment: { vertical: 0, horizontal: { near: 0, distance: 0 } },
  fixingEye: 'LE',
  streaks: { RE: { colour: 'red', pattern: 'solid' }, LE: { colour: 'white', pattern: 'dashed' } },
  response: { reliability: 'fine', threshold: 1, streaksSeen: 'both' },
  wordsKey: 'w-test',
}
const setting = { gaze: 'primary' as const, distance: 'near' as const, readings: { RE: 90, LE: 90 }, prisms: [], lights: 'dim' as const }

describe('drawing the patient\'s view', () => {
  it('covers the visible field, 80 Δ wide by 40 Δ high', () => {
    expect(VIEW_ASPECT).toBe(0.5)
    expect(pxPerDioptre(800)).toBe(10)
  })

  it('tilts a streak with a positive perceived angle so its left end is lower', () => {
    // patient's view: angles anticlockwise; canvas y runs down, so the left end has the larger y
    const seg = streakSegment({ angle: 6, offset: { x: 0, y: 0 } }, 800, 400)
    expect(seg.from.x).toBeLessThan(seg.to.x)
    expect(seg.from.y).toBeGreaterThan(seg.to.y)
    const slope = (seg.from.y - seg.to.y) / (seg.to.x - seg.from.x)
    expect(slope).toBeCloseTo(Math.tan((6 * Math.PI) / 180), 6)
  })

  it('places a streak that sits higher (positive y offset) above the centre', () => {
    const seg = streakSegment({ angle: 0, offset: { x: 0, y: 5 } }, 800, 400)
    expect(seg.centre.y).toBe(200 - 5 * 10)
  })

  it('in learner-turns uses the live optics: a rod left at 90° before an eye level at 96° is drawn tilted', () => {
    const drawn = drawnFromView(buildView(source, setting))
    expect(drawn.source).toBe('live')
    expect(drawn.streaks.RE.angle).toBeCloseTo(6, 6)
    expect(drawn.streaks.LE.angle).toBeCloseTo(0, 6)
  })

  it('moves the right eye\'s streak up when a base-down prism is placed before the right eye', () => {
    // a prism moves the image toward its apex (any ophthalmic optics text): base down → up
    const withSeparation = { ...source, alignment: { vertical: 0, horizontal: { near: 0, distance: 0 } } }
    const prisms = [{ eye: 'RE' as const, power: 6, base: 'down' as const }]
    const drawn = drawnFromView(buildView(withSeparation, { ...setting, prisms }))
    expect(drawn.streaks.RE.offset.y - drawn.streaks.LE.offset.y).toBeCloseTo(6, 6)
    expect(drawn.overlap).toBe(false)
  })

  it('in patient-turns draws the tilts the patient reports, never the case\'s numbers', () => {
    const presentation = {
      fixingEye: 'LE',
      streaks: source.streaks,
      positions: { primary: { alignment: { vertical: 4, horizontal: { near: 0, distance: 0 } } } },
    } as unknown as Presentation
    // the same patient as the presentation: 4 Δ right hypertropia, so the lines do not overlap
    const view = buildView({ ...source, alignment: { vertical: 4, horizontal: { near: 0, distance: 0 } } }, setting)
    const words = describeView(view)
    const drawn = drawnFromReport(presentation, { gaze: 'primary', distance: 'near', words }, [], 'dim')
    expect(drawn.source).toBe('reported')
    // the red (RE) line slopes for this patient: drawn tilted, its left end lower (towards the RE's nose)
    const slope = words.observations.find(o => o.kind === 'slopes')
    expect(slope && slope.kind === 'slopes' && slope.eye).toBe('RE')
    expect(drawn.streaks.RE.angle).toBeGreaterThan(0)
    expect(drawn.streaks.LE.angle).toBe(0)
    // a right hypertropia of 4 Δ puts the RE streak 4 Δ lower (domain.md §3.6)
    expect(drawn.streaks.RE.offset.y - drawn.streaks.LE.offset.y).toBeCloseTo(-4, 6)
  })

  it('hides the streak the patient says they cannot see', () => {
    const presentation = {
      fixingEye: 'LE',
      streaks: source.streaks,
      positions: { primary: { alignment: { vertical: 0, horizontal: { near: 0, distance: 0 } } } },
    } as unknown as Presentation
    const words = { text: 'I can only see one line — the white line.', observations: [{ kind: 'one-line' as const, seen: 'LE' as const }] }
    const drawn = drawnFromReport(presentation, { gaze: 'primary', distance: 'near', words }, [], 'dim')
    expect(drawn.streaks.RE.visible).toBe(false)
    expect(drawn.streaks.LE.visible).toBe(true)
  })
})
