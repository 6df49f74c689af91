import { describe, expect, it } from 'vitest'
import type { DrawnStreak, DrawnView } from '~~/utils/sim/view-geometry'
import { drawnViewInWords, tiltInWords } from '~~/utils/sim/view-words'

const streak = (eye: 'RE' | 'LE', angle: number, extra: Partial<DrawnStreak> = {}): DrawnStreak => ({
  eye,
  colour: eye === 'RE' ? 'red' : 'white',
  pattern: 'solid',
  angle,
  offset: { x: 0, y: eye === 'RE' ? 5 : -5 },
  visible: true,
  ...extra,
})
const view = (re: DrawnStreak, le: DrawnStreak, extra: Partial<DrawnView> = {}): DrawnView =>
  ({ streaks: { RE: re, LE: le }, lights: 'dim', overlap: false, source: 'live', ...extra })

describe('the patient\'s view in words', () => {
  it('says which way and how much each line slopes, in the patient\'s three sizes', () => {
    // anticlockwise (positive) has its left end lower
    expect(tiltInWords(streak('RE', 2))).toBe('the red line (right eye) slopes slightly down to the left')
    expect(tiltInWords(streak('RE', -6))).toBe('the red line (right eye) slopes clearly down to the right')
    expect(tiltInWords(streak('LE', 12, { pattern: 'dashed' }))).toBe('the white dashed line (left eye) slopes steeply down to the left')
    expect(tiltInWords(streak('LE', 0.3))).toBe('the white line (left eye) is level')
    expect(tiltInWords(streak('LE', 3, { visible: false }))).toBe('the white line (left eye) is not in view')
  })

  it('describes the whole view, parallel lines, overlap, lights and a reported view', () => {
    expect(drawnViewInWords(null)).toBe('')
    expect(drawnViewInWords(view(streak('RE', 7), streak('LE', 0)))).toBe(
      'The red line (right eye) slopes clearly down to the left; the white line (left eye) is level.',
    )
    expect(drawnViewInWords(view(streak('RE', 0.1), streak('LE', -0.2)))).toMatch(/is level; .* is level\. The two lines are parallel\.$/)
    expect(drawnViewInWords(view(streak('RE', 3), streak('LE', -3), { overlap: true }))).toMatch(/The two lines lie on top of each other\.$/)
    expect(drawnViewInWords(view(streak('RE', 3), streak('LE', 3), { lights: 'on', source: 'reported' })))
      .toMatch(/^Drawn from the patient's report\. The room lights are on, so the lines are faint\. /)
    expect(drawnViewInWords(view(streak('RE', 3, { visible: false }), streak('LE', 3, { visible: false })))).toBe('No line is in view.')
  })
})
