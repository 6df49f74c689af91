import { describe, expect, it } from 'vitest'
import { SLIP_CODES, SLIP_INFO, isSlipCode } from '#shared/engine/slips'

describe('slip codes', () => {
  it('are exactly the stable codes of domain.md §5.3', () => {
    expect([...SLIP_CODES].sort()).toEqual(
      [
        'direction-reversed', 'left-right-rule-swapped', 'dial-value-as-amount', 'amount-off', 'eye-wrong', 'not-parallel',
        'test-unnamed', 'eye-missing', 'amount-missing', 'direction-missing', 'gaze-missing', 'should-not-test',
      ].sort(),
    )
  })
  it('each has a title and a plain-English explanation', () => {
    for (const c of SLIP_CODES) {
      expect(SLIP_INFO[c].title.length).toBeGreaterThan(5)
      expect(SLIP_INFO[c].explanation.length).toBeGreaterThan(30)
    }
    expect(isSlipCode('amount-off')).toBe(true)
    expect(isSlipCode('made-up')).toBe(false)
  })
  it('explains the per-eye reading rule where it matters', () => {
    // common practice, derived from ISO 8429:1986 (domain.md §3.4)
    expect(SLIP_INFO['left-right-rule-swapped'].explanation).toMatch(/reading − 90.*90 − reading/)
    expect(SLIP_INFO['dial-value-as-amount'].explanation).toMatch(/100°.*10°/)
  })
})
