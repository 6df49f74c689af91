import { describe, expect, it } from 'vitest'
import { criterionWords, markWord, slipsLine } from '#shared/marks/words'
import { QUIZ_CRITERIA } from '#shared/schemas/quiz'
import { SLIP_INFO, isSlipCode } from '#shared/engine/slips'

const title = (code: string) => (isSlipCode(code) ? SLIP_INFO[code].title : 'Another slip')

describe('marks in words', () => {
  it('names every quiz criterion and the fundus and interpretation criteria, never by key', () => {
    for (const c of [...QUIZ_CRITERIA, 'higher-eye', 'worse-gaze', 'worse-tilt', 'muscle', 'angle', 'finding']) {
      expect(criterionWords(c)).not.toBe(c)
      expect(criterionWords(c)).not.toBe('Another criterion')
    }
    expect(criterionWords('no-such-thing')).toBe('Another criterion')
  })

  it('says a mark as full, half, part or none', () => {
    expect([1, 0.5, 0.25, 0].map(markWord)).toEqual(['Full', 'Half', 'Part', 'None'])
  })

  it('lists each slip of an attempt once, with its eye', () => {
    const line = slipsLine([
      { code: 'direction-reversed', eye: 'RE' },
      { code: 'direction-reversed', eye: 'LE' },
      { code: 'test-unnamed' },
      { code: 'dial-value-as-amount', eye: 'LE' },
      { code: 'dial-value-as-amount', eye: 'LE' },
    ], title)
    expect(line).toBe(`${SLIP_INFO['direction-reversed'].title} (both eyes); ${SLIP_INFO['test-unnamed'].title}; ${SLIP_INFO['dial-value-as-amount'].title} (left eye)`)
  })
})
