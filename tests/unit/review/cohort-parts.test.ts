// byCohortParts: a view over many cohorts walked in parts (side by side on
// PostgreSQL). The parts cover the scope's cohorts exactly once, and the rows of
// the parts add up to the rows of the whole, on a real (in-memory) SQLite database.
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import type { Kysely } from 'kysely'
import { reviewFilterQuery } from '#shared/schemas/review'
import { migrateToLatest, openDatabase } from '../../../db/open'
import type { Database } from '../../../db/schema'
import { statementsAtOnce } from '../../../db/dialect'
import { applyReviewFilters } from '~~/server/lib/review/filters'
import { byCohortParts } from '~~/server/lib/review/scope'
import type { ReviewScope } from '~~/server/lib/review/scope'
import { insertAttempts, resetSharedCase } from '../../support/review-rows'
import type { RowAttempt } from '../../support/review-rows'

let db: Kysely<Database>
const lecturer: ReviewScope = { cohortIds: null, role: 'lecturer', userId: 0 }

beforeEach(async () => {
  db = openDatabase(':memory:')
  resetSharedCase()
  await migrateToLatest(db)
})
afterEach(async () => {
  await db.destroy()
})

async function cohortsWithAttempts(names: string[]): Promise<number[]> {
  const now = new Date().toISOString()
  const cohorts: number[] = []
  for (const name of names) cohorts.push((await db.insertInto('cohorts').values({ name, created_at: now, updated_at: now }).returning('id').executeTakeFirstOrThrow()).id)
  const rows: RowAttempt[] = []
  for (const [i, cohortId] of cohorts.entries()) {
    const { id } = await db.insertInto('users').values({ email: `p${i}@x.test`, name: `Learner ${i}`, role: 'student', password_hash: 'x', created_at: now, updated_at: now }).returning('id').executeTakeFirstOrThrow()
    await db.insertInto('cohort_members').values({ cohort_id: cohortId, user_id: id, created_at: now }).execute()
    // cohort i has i + 1 attempts on two days, so every cohort's count is its own
    for (let k = 0; k <= i; k++) rows.push({ learnerId: id, cohortId, submittedAt: `2026-11-0${1 + (k % 2)}T09:00:00.000Z`, slips: [] })
  }
  await insertAttempts(db, rows)
  return cohorts
}

const perCohortDay = (scope: ReviewScope) => applyReviewFilters(db.selectFrom('attempts'), 'attempts', reviewFilterQuery.parse({}), scope)
  .select(eb => ['attempts.cohort_id', 'attempts.submitted_at', eb.fn.countAll<number>().as('n')])
  .groupBy(['attempts.cohort_id', 'attempts.submitted_at']).orderBy('attempts.cohort_id').orderBy('attempts.submitted_at').execute()

describe('byCohortParts', () => {
  it('SQLite answers one statement at a time, so its scope stays whole', async () => {
    expect(statementsAtOnce(db)).toBe(1)
    const seen: ReviewScope[] = []
    await byCohortParts(db, lecturer, async (part) => {
      seen.push(part)
      return []
    })
    expect(seen).toEqual([lecturer])
  })

  it('cuts every cohort into the asked number of parts, each cohort in exactly one', async () => {
    const cohorts = await cohortsWithAttempts(['A', 'B', 'C', 'D', 'E'])
    const seen: number[][] = []
    await byCohortParts(db, lecturer, async (part) => {
      seen.push(part.cohortIds!)
      return []
    }, 3)
    expect(seen).toHaveLength(3)
    expect(seen.flat().sort((a, b) => a - b)).toEqual([...cohorts].sort((a, b) => a - b))
    // a tutor's scope is cut within its own cohorts only
    const taught = { ...lecturer, role: 'tutor' as const, cohortIds: cohorts.slice(0, 2) }
    const tutorParts: number[][] = []
    await byCohortParts(db, taught, async (part) => {
      tutorParts.push(part.cohortIds!)
      return []
    }, 3)
    expect(tutorParts.flat().sort((a, b) => a - b)).toEqual(cohorts.slice(0, 2).sort((a, b) => a - b))
    expect(tutorParts).toHaveLength(2)
  })

  it('the parts\' rows are the whole\'s rows: a grouped count over five cohorts in 1, 2 and 3 parts', async () => {
    await cohortsWithAttempts(['A', 'B', 'C', 'D', 'E'])
    const whole = await perCohortDay(lecturer)
    expect(whole.reduce((n, r) => n + Number(r.n), 0)).toBe(1 + 2 + 3 + 4 + 5)
    const key = (r: { cohort_id: number | null, submitted_at: string }) => `${r.cohort_id} ${r.submitted_at}`
    for (const parts of [1, 2, 3]) {
      const rows = await byCohortParts(db, lecturer, perCohortDay, parts)
      expect([...rows].sort((a, b) => key(a).localeCompare(key(b)))).toEqual([...whole].sort((a, b) => key(a).localeCompare(key(b))))
    }
  })

  it('a single cohort is never cut', async () => {
    const [only] = await cohortsWithAttempts(['A'])
    const seen: ReviewScope[] = []
    await byCohortParts(db, lecturer, async (part) => {
      seen.push(part)
      return []
    }, 3)
    expect(seen).toEqual([lecturer])
    const one = { ...lecturer, cohortIds: [only!] }
    seen.length = 0
    await byCohortParts(db, one, async (part) => {
      seen.push(part)
      return []
    }, 3)
    expect(seen).toEqual([one])
  })
})
