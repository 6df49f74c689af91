// Per-learner slip patterns on hand-made attempt histories (issue 6, item 2).
import { describe, expect, it } from 'vitest'
import { fc, test } from '@fast-check/vitest'
import { findRuleSwap, ruleSwapEvidence } from '#shared/engine/slips'
import type { RuleSwapAttempt, Slip } from '#shared/engine/slips'
import { countsFromHistory, detectPatterns, needsHelpScore, ruleSwapEye } from '#shared/review/patterns'
import { attemptArb, attemptOn } from '../../support/slip-histories'

type H = RuleSwapAttempt[]
/** Both eyes clearly torted (a bilateral palsy): a one-eye reversal here tells a rule swap from recording the image. */
const BOTH = { RE: 6, LE: -4 }
/** Only the right eye torted (a right palsy, healthy left eye): a reversal here cannot tell the two habits apart. */
const RIGHT_ONLY = { RE: 7, LE: 0.6 }
const LEFT_ONLY = { RE: 0, LE: -5 }
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

  it('finds a left-eye rule swap: the left eye reversed while the torted right eye is recorded the right way', () => {
    const h = [...clean(3), attemptOn(BOTH, ['LE']), attemptOn(BOTH, ['LE']), attemptOn(BOTH, ['LE']), one('amount-off', 'RE')]
    expect(codes(h)).toEqual(['left-right-rule-swapped:LE'])
    const found = detectPatterns(countsFromHistory(h))[0]!
    expect(found).toMatchObject({ count: 3, of: 7 })
  })

  it('finds a right-eye rule swap', () => {
    expect(codes([...clean(2), attemptOn(BOTH, ['RE']), attemptOn(BOTH, ['RE'])])).toEqual(['left-right-rule-swapped:RE'])
  })

  it('does not call recording the image on cases with one eye torted a rule swap (issue 11)', () => {
    // each attempt reverses the only torted eye: recording the image would do exactly that
    expect(codes([...clean(3), attemptOn(RIGHT_ONLY, ['RE']), attemptOn(RIGHT_ONLY, ['RE']), attemptOn(RIGHT_ONLY, ['RE'])])).toEqual(['image-recorded'])
    expect(codes([...clean(3), attemptOn(LEFT_ONLY, ['LE']), attemptOn(LEFT_ONLY, ['LE'])])).toEqual(['image-recorded'])
    // the same slips with no truth to tell them apart count the same way
    expect(codes([...clean(2), rev('RE'), rev('RE')])).toEqual(['image-recorded'])
    const counts = countsFromHistory([attemptOn(RIGHT_ONLY, ['RE']), attemptOn(RIGHT_ONLY, ['RE'])])
    expect(counts.reversed.reOnly).toBe(2)
    expect(counts.ruleSwap).toEqual({ RE: 0, LE: 0 })
  })

  it('takes as evidence only a fellow eye torted by 1° or more and recorded with the right direction', () => {
    const reversedLE = (torsion: { RE: number, LE: number }, recordedRE: 'excyclo' | 'incyclo' | 'none' | null): RuleSwapAttempt =>
      ({ slips: [{ code: 'direction-reversed', eye: 'LE' }], torsion, recorded: { RE: recordedRE, LE: 'incyclo' } })
    // domain.md §5.2: a true torsion of 1° or more has a direction
    expect(ruleSwapEvidence(reversedLE({ RE: 1, LE: 5 }, 'excyclo'))).toBe('LE')
    expect(ruleSwapEvidence(reversedLE({ RE: -1.5, LE: 5 }, 'incyclo'))).toBe('LE')
    expect(ruleSwapEvidence(reversedLE({ RE: 0.9, LE: 5 }, 'excyclo'))).toBeNull()
    expect(ruleSwapEvidence(reversedLE({ RE: 4, LE: 5 }, 'none'))).toBeNull()
    expect(ruleSwapEvidence(reversedLE({ RE: 4, LE: 5 }, null))).toBeNull()
    expect(ruleSwapEvidence(reversedLE({ RE: 4, LE: 5 }, 'incyclo'))).toBeNull()
    expect(ruleSwapEvidence({ slips: [{ code: 'direction-reversed', eye: 'LE' }] })).toBeNull()
    // both eyes reversed is never evidence
    expect(ruleSwapEvidence(attemptOn(BOTH, ['RE', 'LE']))).toBeNull()
  })

  it('keeps a swap found on telling attempts, counting only those, and drops it when the other eye is ever reversed alone', () => {
    const h = [...clean(2), attemptOn(BOTH, ['LE']), attemptOn(BOTH, ['LE']), attemptOn(LEFT_ONLY, ['LE']), attemptOn(LEFT_ONLY, ['LE'])]
    expect(detectPatterns(countsFromHistory(h))).toEqual([{ code: 'left-right-rule-swapped', eye: 'LE', count: 2, of: 6 }])
    // a right eye reversed on its own (even where it cannot tell) does not fit a left-eye swap
    expect(codes([...h, attemptOn(RIGHT_ONLY, ['RE'])])).toEqual(['image-recorded'])
    // a single telling attempt is not yet a pattern: the reversals count as recording the image
    expect(codes([...clean(2), attemptOn(BOTH, ['LE']), attemptOn(LEFT_ONLY, ['LE']), attemptOn(LEFT_ONLY, ['LE'])])).toEqual(['image-recorded'])
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
    expect(codes([...clean(2), attemptOn(BOTH, ['LE']), attemptOn(BOTH, ['LE']), attemptOn(BOTH, ['LE'])])).not.toContain('records-not-measures')
    expect(codes([...clean(2), rev('LE'), rev('LE'), rev('LE')])).not.toContain('records-not-measures')
  })

  it('ranks by weighted evidence', () => {
    const swap = detectPatterns(countsFromHistory([...clean(2), attemptOn(BOTH, ['LE']), attemptOn(BOTH, ['LE']), attemptOn(BOTH, ['LE'])]))
    const unnamed = detectPatterns(countsFromHistory([...clean(2), one('test-unnamed'), one('test-unnamed'), one('test-unnamed')]))
    expect(needsHelpScore(swap)).toBeGreaterThan(needsHelpScore(unnamed))
  })
})

const historyArb = fc.array(attemptArb(['direction-reversed', 'direction-reversed', 'amount-off', 'test-unnamed', 'not-parallel']), { maxLength: 15 })

describe('the rule swap on counts agrees with findRuleSwap', () => {
  test.prop([historyArb, fc.integer({ min: 1, max: 4 })], { numRuns: 500 })('on random histories', (history, minimum) => {
    const expected = findRuleSwap(history, minimum)?.eye ?? null
    expect(ruleSwapEye(countsFromHistory(history), minimum)).toBe(expected)
  })

  test.prop([historyArb])('and is claimed only where enough attempts tell it apart from recording the image', (history) => {
    const swap = findRuleSwap(history)
    if (swap) expect(history.filter(a => ruleSwapEvidence(a) === swap.eye).length).toBeGreaterThanOrEqual(2)
    // without the truth, no history is a rule swap
    expect(findRuleSwap(history.map(a => ({ slips: a.slips })))).toBeNull()
  })

  test.prop([historyArb])('and detectPatterns reports exactly that swap', (history) => {
    const swap = detectPatterns(countsFromHistory(history)).find(p => p.code === 'left-right-rule-swapped')
    expect(swap?.eye ?? null).toBe(findRuleSwap(history)?.eye ?? null)
  })
})
