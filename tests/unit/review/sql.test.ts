// The review's SQL against a real (in-memory) SQLite database with the real
// migrations: per-learner counts agree with the plain-history rules (and so
// with findRuleSwap), and each aggregate matches counts worked out by hand.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { fc } from '@fast-check/vitest'
import type { Kysely } from 'kysely'
import { findRuleSwap } from '#shared/engine/slips'
import { countsFromHistory, ruleSwapEye } from '#shared/review/patterns'
import { reviewFilterQuery } from '#shared/schemas/review'
import type { ReviewFilters } from '#shared/schemas/review'
import { migrateToLatest, openDatabase } from '../../../db/open'
import type { Database } from '../../../db/schema'
import { amountBands, directionTable, reviewTotals, slipCodeCounts, slipTable, weeklyTrend } from '~~/server/lib/review/aggregates'
import { learnerCounts } from '~~/server/lib/review/learners'
import type { ReviewScope } from '~~/server/lib/review/scope'
import { insertAttempts, resetSharedCase } from '../../support/review-rows'
import { historyArb } from '../../support/slip-histories'
import type { RowAttempt } from '../../support/review-rows'

let db: Kysely<Database>
const all: ReviewScope = { cohortIds: null, role: 'lecturer', userId: 0 }
const f = (q: Record<string, string> = {}): ReviewFilters => reviewFilterQuery.parse(q)

async function people(n: number, cohortNames = ['A', 'B']) {
  const now = new Date().toISOString()
  const cohorts: number[] = []
  for (const name of cohortNames) cohorts.push((await db.insertInto('cohorts').values({ name, created_at: now, updated_at: now }).returning('id').executeTakeFirstOrThrow()).id)
  const ids: number[] = []
  for (let i = 0; i < n; i++) {
    const { id } = await db.insertInto('users').values({ email: `l${i}-${Math.random()}@x.test`, name: `Learner ${i}`, role: 'student', password_hash: 'x', created_at: now, updated_at: now }).returning('id').executeTakeFirstOrThrow()
    await db.insertInto('cohort_members').values({ cohort_id: cohorts[i % cohorts.length]!, user_id: id, created_at: now }).execute()
    ids.push(id)
  }
  return { cohorts, ids }
}

beforeAll(() => {
  db = openDatabase(':memory:')
})
afterAll(async () => {
  await db.destroy()
})
beforeEach(async () => {
  await db.destroy().catch(() => {})
  db = openDatabase(':memory:')
  resetSharedCase()
  await migrateToLatest(db)
})

const CODES = ['direction-reversed', 'direction-reversed', 'dial-value-as-amount', 'amount-off', 'test-unnamed', 'not-parallel'] as const

describe('per-learner counts in SQL', () => {
  it('equal the plain-history counts, and the SQL rule swap equals findRuleSwap, on random histories', async () => {
    const histories = fc.sample(historyArb(CODES, { minLength: 1, maxLength: 12 }), { numRuns: 60, seed: 6 })
    const { cohorts, ids } = await people(histories.length)
    const rows: RowAttempt[] = histories.flatMap((h, i) => h.map((a, j) => ({
      learnerId: ids[i]!, cohortId: cohorts[i % cohorts.length]!, submittedAt: `2026-10-${String(1 + (j % 28)).padStart(2, '0')}T10:00:00.000Z`, slips: a.slips,
      torsion: a.torsion, reRecorded: a.recorded.RE, leRecorded: a.recorded.LE,
    })))
    await insertAttempts(db, rows)
    const sqlCounts = await learnerCounts(db, f(), all)
    let swaps = 0
    histories.forEach((h, i) => {
      const expected = countsFromHistory(h)
      const got = sqlCounts.get(ids[i]!)!
      expect(got).toEqual(expected)
      const swap = findRuleSwap(h)?.eye ?? null
      if (swap) swaps++
      expect(ruleSwapEye(got)).toBe(swap)
    })
    // the sample must exercise the rule, not only its absence
    expect(swaps).toBeGreaterThan(0)
  })
})

describe('aggregates against hand-computed counts', () => {
  async function smallSet() {
    const { cohorts, ids } = await people(3)
    const [a, b] = cohorts as [number, number]
    const [l0, l1, l2] = ids as [number, number, number]
    // l0 and l2 are in cohort A (people() alternates), l1 in cohort B
    const rows: RowAttempt[] = [
      { learnerId: l0, cohortId: a, submittedAt: '2026-11-02T09:00:00.000Z', slips: [{ code: 'direction-reversed', eye: 'LE' }], leTrue: 'excyclo', leRecorded: 'incyclo', reTrue: null, leError: 0 },
      { learnerId: l0, cohortId: a, submittedAt: '2026-11-03T09:00:00.000Z', slips: [{ code: 'direction-reversed', eye: 'LE' }, { code: 'test-unnamed' }], leTrue: 'incyclo', leRecorded: 'excyclo', leError: 1.5 },
      { learnerId: l0, cohortId: a, submittedAt: '2026-11-09T09:00:00.000Z', slips: [], reTrue: 'excyclo', reRecorded: 'excyclo', reError: -3 },
      { learnerId: l2, cohortId: a, kind: 'quiz', quizId: 7, submittedAt: '2026-11-10T09:00:00.000Z', slips: [{ code: 'dial-value-as-amount', eye: 'RE' }], reTrue: 'excyclo', reRecorded: 'excyclo', reError: 92, leTrue: 'excyclo', leRecorded: null, leError: null },
      { learnerId: l1, cohortId: b, submittedAt: '2026-11-04T09:00:00.000Z', slips: [{ code: 'direction-reversed', eye: 'RE' }, { code: 'direction-reversed', eye: 'LE' }], reTrue: 'incyclo', reRecorded: 'excyclo', leTrue: 'excyclo', leRecorded: 'incyclo', reError: 6, leError: -6 },
      { learnerId: l1, cohortId: b, templateId: 'io-palsy-right-standard', condition: 'io-palsy', submittedAt: '2026-11-16T09:00:00.000Z', slips: [{ code: 'amount-off', eye: 'RE' }], reTrue: 'incyclo', reRecorded: 'none', reError: 30 },
    ]
    await insertAttempts(db, rows)
    return { a, b, l0, l1, l2 }
  }

  it('counts slips by code, with the filters', async () => {
    const { a } = await smallSet()
    const byCode = async (q: Record<string, string>, scope = all) => {
      const filters = f(q)
      const totals = await reviewTotals(db, filters, scope)
      return { totals, counts: Object.fromEntries(slipTable(await slipCodeCounts(db, filters, scope), totals.attempts).filter(s => s.count).map(s => [s.code, s.count])) }
    }
    expect(await byCode({})).toEqual({ totals: { attempts: 6, learners: 3 }, counts: { 'direction-reversed': 4, 'test-unnamed': 1, 'dial-value-as-amount': 1, 'amount-off': 1 } })
    expect(await byCode({ cohortId: String(a) }, { ...all, cohortIds: [a] })).toEqual({ totals: { attempts: 4, learners: 2 }, counts: { 'direction-reversed': 2, 'test-unnamed': 1, 'dial-value-as-amount': 1 } })
    expect(await byCode({ kind: 'quiz' })).toEqual({ totals: { attempts: 1, learners: 1 }, counts: { 'dial-value-as-amount': 1 } })
    expect(await byCode({ quizId: '7' })).toEqual({ totals: { attempts: 1, learners: 1 }, counts: { 'dial-value-as-amount': 1 } })
    expect(await byCode({ eye: 'LE' })).toEqual({ totals: { attempts: 6, learners: 3 }, counts: { 'direction-reversed': 3 } })
    expect(await byCode({ from: '2026-11-03', to: '2026-11-04' })).toEqual({ totals: { attempts: 2, learners: 2 }, counts: { 'direction-reversed': 3, 'test-unnamed': 1 } })
    expect(await byCode({ template: 'io-palsy-right' })).toEqual({ totals: { attempts: 1, learners: 1 }, counts: { 'amount-off': 1 } })
    expect(await byCode({ condition: 'io-palsy' })).toEqual({ totals: { attempts: 1, learners: 1 }, counts: { 'amount-off': 1 } })
    // a tutor's scope with no cohorts sees nothing
    expect(await byCode({}, { ...all, cohortIds: [] })).toEqual({ totals: { attempts: 0, learners: 0 }, counts: {} })
  })

  it('builds the direction table per eye', async () => {
    await smallSet()
    const t = await directionTable(db, f(), all)
    expect(t.LE.excyclo).toEqual({ excyclo: 0, incyclo: 2, none: 0, missing: 1 })
    expect(t.LE.incyclo).toEqual({ excyclo: 1, incyclo: 0, none: 0, missing: 0 })
    expect(t.RE.excyclo).toEqual({ excyclo: 2, incyclo: 0, none: 0, missing: 0 })
    expect(t.RE.incyclo).toEqual({ excyclo: 1, incyclo: 0, none: 1, missing: 0 })
    const onlyRe = await directionTable(db, f({ eye: 'RE' }), all)
    expect(onlyRe.LE.excyclo).toEqual({ excyclo: 0, incyclo: 0, none: 0, missing: 0 })
    expect(onlyRe.RE.incyclo.none).toBe(1)
  })

  it('bands the amount errors', async () => {
    await smallSet()
    const { bands, recorded } = await amountBands(db, f(), all)
    const by = Object.fromEntries(bands.map(b => [b.band, [b.RE, b.LE]]))
    // RE errors: −3, 92, 6, 30; LE errors: 0, 1.5, −6
    expect(by).toEqual({ 'under-5': [0, 1], 'minus-5-2': [1, 0], 'within-2': [0, 2], 'plus-2-5': [0, 0], 'plus-5-30': [1, 0], 'dial-figure': [2, 0] })
    expect(recorded).toEqual({ RE: 4, LE: 3 })
  })

  it('groups attempts and slips by week, Monday first', async () => {
    await smallSet()
    const weeks = await weeklyTrend(db, f(), all)
    // 2026-11-02 is a Monday (from memory; checked by weekOf's own arithmetic below)
    expect(weeks.map(w => [w.week, w.attempts])).toEqual([['2026-11-02', 3], ['2026-11-09', 2], ['2026-11-16', 1]])
    expect(weeks[0]!.slips).toEqual({ 'direction-reversed': 4, 'test-unnamed': 1 })
    expect(weeks[1]!.slips).toEqual({ 'dial-value-as-amount': 1 })
    expect(new Date('2026-11-02T00:00:00Z').getUTCDay()).toBe(1)
  })
})
