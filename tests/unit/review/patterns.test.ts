// Per-learner slip patterns on hand-made attempt histories (issue 6, item 2).
import { describe, expect, it } from 'vitest'
import { fc, test } from '@fast-check/vitest'
import { findRuleSwap } from '#shared/engine/slips'
import type { Slip } from '#shared/engine/slips'
import { countsFromHistory, detectPatterns, needsHelpScore, ruleSwapEye } from '#shared/review/patterns'

type H = { slips: Slip[] }[]
const clean = (n: number): H => Array.from({ length: n }, () => ({ slips: [] }))
const rev = (...eyes: ('RE' | 'LE')[]): { slips: Slip[] } => ({ slips: eyes.map(eye => ({ code: 'direction-reversed', eye })) })
const one = (code: Slip['code'], eye?: 'RE' | 'LE'): { slips: Slip[] } => ({ slips: [{ code, ...(eye ? { eye } : {}) }] })
const codes = (h: H) => detectPatterns(countsFromHistory(h)).map(p => (p.eye ? `${p.code}:${p.eye}` : p.code))

describe('pattern detection on hand-made histories', () => {
  it('finds nothing in a clean history, nor in a mostly clean one with a single slip of each kind', () => {
    expect(codes(clean(12))).toEqual([])
    expect(codes([...clean(20), rev('LE'), one('dial-value-as-amount', 'RE'), one('test-unnamed'), one('not-parallel', 'LE')])).toEqual([])
    expect(codes([])).toEqual([])
  })

  it('finds a left-eye rule swap: the left eye reversed on its own, the right never', () => {
    const h = [...clean(3), rev('LE'), rev('LE'), rev('LE'), one('amount-off', 'RE')]
    expect(codes(h)).toEqual(['left-right-rule-swapped:LE'])
    const found = detectPatterns(countsFromHistory(h))[0]!
    expect(found).toMatchObject({ count: 3, of: 7 })
  })

  it('finds a right-eye rule swap', () => {
    expect(codes([...clean(2), rev('RE'), rev('RE')])).toEqual(['left-right-rule-swapped:RE'])
  })

  it('reads reversals in both eyes as recording the image, not as a rule swap', () => {
    expect(codes([...clean(2), rev('RE', 'LE'), rev('RE', 'LE'), rev('RE', 'LE')])).toEqual(['image-recorded'])
    // one-eye cases on both sides: each eye reversed on its own
    expect(codes([...clean(3), rev('RE'), rev('LE'), rev('RE'), rev('LE')])).toEqual(['image-recorded'])
  })

  it('finds dial figures written as amounts', () => {
    expect(codes([...clean(4), one('dial-value-as-amount', 'RE'), one('dial-value-as-amount', 'LE'), one('dial-value-as-amount', 'LE')])).toEqual(['dial-value-as-amount'])
  })

  it('finds records that name no test', () => {
    expect(codes([...clean(5), one('test-unnamed'), one('test-unnamed'), one('test-unnamed')])).toEqual(['test-unnamed'])
  })

  it('finds "measures badly, records correctly" and its reverse', () => {
    expect(codes([...clean(4), one('not-parallel', 'RE'), one('not-parallel', 'LE'), one('not-parallel', 'RE')])).toEqual(['measures-not-records'])
    expect(codes([...clean(4), one('amount-off', 'RE'), one('eye-wrong', 'LE'), one('amount-missing', 'RE')])).toEqual(['records-not-measures'])
    // bad measuring with bad recording is neither
    expect(codes([...clean(2), { slips: [{ code: 'not-parallel', eye: 'RE' }, { code: 'amount-off', eye: 'RE' }] }, { slips: [{ code: 'not-parallel', eye: 'LE' }, { code: 'eye-wrong', eye: 'LE' }] }])).toEqual([])
  })

  it('lets a specific recording habit stand instead of the general one', () => {
    expect(codes([...clean(2), rev('LE'), rev('LE'), rev('LE')])).not.toContain('records-not-measures')
  })

  it('ranks by weighted evidence', () => {
    const swap = detectPatterns(countsFromHistory([...clean(2), rev('LE'), rev('LE'), rev('LE')]))
    const unnamed = detectPatterns(countsFromHistory([...clean(2), one('test-unnamed'), one('test-unnamed'), one('test-unnamed')]))
    expect(needsHelpScore(swap)).toBeGreaterThan(needsHelpScore(unnamed))
  })
})

const slipArb = fc.record({
  code: fc.constantFrom('direction-reversed', 'direction-reversed', 'amount-off', 'test-unnamed', 'not-parallel'),
  eye: fc.option(fc.constantFrom('RE', 'LE'), { nil: undefined }),
}).map(s => (s.eye ? { code: s.code, eye: s.eye } : { code: s.code }) as Slip)
const historyArb = fc.array(fc.record({ slips: fc.array(slipArb, { maxLength: 4 }) }), { maxLength: 15 })

describe('the rule swap on counts agrees with findRuleSwap', () => {
  test.prop([historyArb, fc.integer({ min: 1, max: 4 })], { numRuns: 500 })('on random histories', (history, minimum) => {
    const expected = findRuleSwap(history, minimum)?.eye ?? null
    expect(ruleSwapEye(countsFromHistory(history).reversed, minimum)).toBe(expected)
  })

  test.prop([historyArb])('and detectPatterns reports exactly that swap', (history) => {
    const swap = detectPatterns(countsFromHistory(history)).find(p => p.code === 'left-right-rule-swapped')
    expect(swap?.eye ?? null).toBe(findRuleSwap(history)?.eye ?? null)
  })
})
