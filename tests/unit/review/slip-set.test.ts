// The slip set: an attempt's distinct slips as one key (attempts.slip_set), and the
// fold that turns grouped keys back into a learner's counts. The fold must add up to
// exactly what countsFromHistory counts from the plain slips.
import { describe, expect, it } from 'vitest'
import { fc } from '@fast-check/vitest'
import type { Slip } from '#shared/engine/slips'
import { countsFromHistory, emptyCounts } from '#shared/review/patterns'
import { addSlipSet, slipSetOf, slipsOfSet } from '#shared/review/slip-set'

const slipArb = fc.record({
  code: fc.constantFrom('direction-reversed', 'dial-value-as-amount', 'amount-off', 'test-unnamed', 'not-parallel', 'eye-missing', 'gaze-missing'),
  eye: fc.option(fc.constantFrom('RE', 'LE'), { nil: undefined }),
}).map(s => (s.eye ? { code: s.code, eye: s.eye } : { code: s.code }) as Slip)

describe('slipSetOf', () => {
  it('writes each distinct slip once, sorted, with its eye', () => {
    expect(slipSetOf([])).toBe('')
    expect(slipSetOf([{ code: 'test-unnamed' }, { code: 'direction-reversed', eye: 'RE' }, { code: 'direction-reversed', eye: 'LE' }, { code: 'test-unnamed' }]))
      .toBe('direction-reversed:LE direction-reversed:RE test-unnamed')
  })

  it('ignores order and repeats, and reads back as the distinct slips', () => {
    fc.assert(fc.property(fc.array(slipArb, { maxLength: 6 }), (slips) => {
      const key = slipSetOf(slips)
      expect(slipSetOf([...slips].reverse())).toBe(key)
      expect(slipSetOf([...slips, ...slips])).toBe(key)
      const back = slipsOfSet(key)
      expect(slipSetOf(back)).toBe(key)
      expect(back).toHaveLength(new Set(slips.map(s => `${s.code}/${s.eye ?? ''}`)).size)
    }), { seed: 7, numRuns: 200 })
  })
})

describe('addSlipSet', () => {
  it('folds grouped keys into the counts countsFromHistory gives, on random histories', () => {
    fc.assert(fc.property(fc.array(fc.record({ slips: fc.array(slipArb, { maxLength: 4 }) }), { maxLength: 30 }), (history) => {
      // what the SQL returns: attempts grouped by key, with a count
      const groups = new Map<string, number>()
      for (const a of history) groups.set(slipSetOf(a.slips), (groups.get(slipSetOf(a.slips)) ?? 0) + 1)
      const c = emptyCounts()
      for (const [key, n] of groups) addSlipSet(c, key, n)
      expect(c).toEqual(countsFromHistory(history))
    }), { seed: 11, numRuns: 300 })
  })
})
