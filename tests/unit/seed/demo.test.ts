// The demo school as seeded (db/seed), on a real in-memory database with the real
// migrations and recordAttempt: nothing it stores is dated after the moment it was
// seeded, and every attempt's slip set (attempts.slip_set, kept by recordAttempt)
// equals the one counted from scratch from its attempt_slips rows.
import type { Kysely } from 'kysely'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { ruleSwapEvidence } from '#shared/engine/slips'
import { countsFromHistory } from '#shared/review/patterns'
import type { Slip } from '#shared/engine/slips'
import { slipSetOf } from '#shared/review/slip-set'
import { reviewFilterQuery } from '#shared/schemas/review'
import { migrateToLatest, openDatabase } from '../../../db/open'
import type { Database } from '../../../db/schema'
import { seedDemoIfWanted } from '../../../db/seed'
import { learnerCounts } from '~~/server/lib/review/learners'

// the clock stands still during the seed, so "after now" means exactly that
const NOW = '2026-12-02T09:30:00.000Z'
let db: Kysely<Database>

beforeAll(async () => {
  db = openDatabase(':memory:')
  await migrateToLatest(db)
  vi.useFakeTimers({ toFake: ['Date'] })
  vi.setSystemTime(new Date(NOW))
  try {
    expect(await seedDemoIfWanted(db, { dev: false, flag: '1', hashPassword: async () => 'not-a-real-hash' })).toBe(true)
  }
  finally {
    vi.useRealTimers()
  }
}, 60_000)
afterAll(async () => {
  await db.destroy()
})

describe('demo seed', () => {
  it('dates no attempt, slip, patient turn or sitting after the moment of seeding', async () => {
    const { n } = await db.selectFrom('attempts').select(eb => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow()
    expect(Number(n)).toBeGreaterThan(200)
    const late = async (table: 'attempts' | 'attempt_slips' | 'case_turns' | 'quiz_sittings', column: string) =>
      (await (db as Kysely<any>).selectFrom(table).select(['id', column]).where(column, '>', NOW).execute())
    expect(await late('attempts', 'submitted_at')).toEqual([])
    expect(await late('attempts', 'started_at')).toEqual([])
    expect(await late('attempt_slips', 'created_at')).toEqual([])
    expect(await late('case_turns', 'created_at')).toEqual([])
    expect(await (db as Kysely<any>).selectFrom('quiz_sittings').select(['quiz_id', 'student_id', 'started_at', 'finished_at'])
      .where(eb => eb.or([eb('started_at', '>', NOW), eb('finished_at', '>', NOW)])).execute()).toEqual([])
    // the open quiz's sitting is part-way through: started, not finished, nothing submitted
    const open = await db.selectFrom('quiz_sittings').select(['quiz_id', 'student_id']).where('finished_at', 'is', null).execute()
    expect(open.length).toBeGreaterThan(0)
    for (const s of open) {
      const stored = await db.selectFrom('attempts').select('id').where('quiz_id', '=', s.quiz_id).where('learner_id', '=', s.student_id).execute()
      expect(stored).toEqual([])
    }
  })

  it('stores each attempt\'s slip set exactly as counted from scratch from its slip rows, and the counts follow', async () => {
    const attempts = await db.selectFrom('attempts').select(['id', 'learner_id', 'slip_set', 'rule_swap_eye', 'truth_json', 're_recorded_direction', 'le_recorded_direction']).where('cohort_id', 'is not', null).execute()
    const slips = await db.selectFrom('attempt_slips').select(['attempt_id', 'code', 'eye']).execute()
    const slipsOf = (id: number) => slips.filter(s => s.attempt_id === id).map(s => (s.eye ? { code: s.code, eye: s.eye } : { code: s.code }) as Slip)
    expect(attempts.filter(a => a.slip_set !== slipSetOf(slipsOf(a.id)))).toEqual([])
    // the demo's planted habits make slips of several kinds
    expect(new Set(attempts.map(a => a.slip_set)).size).toBeGreaterThan(4)

    const counts = await learnerCounts(db, reviewFilterQuery.parse({}), { cohortIds: null, role: 'lecturer', userId: 0 })
    const learners = [...new Set(attempts.map(a => a.learner_id))]
    expect(learners.length).toBeGreaterThan(8)
    for (const id of learners) {
      const history = attempts.filter(a => a.learner_id === id).map(a => ({ slips: slipsOf(a.id), torsion: JSON.parse(a.truth_json).torsion, recorded: { RE: a.re_recorded_direction, LE: a.le_recorded_direction } }))
      expect(counts.get(id), `learner ${id}`).toEqual(countsFromHistory(history))
    }
    // the rule-swap evidence recordAttempt stored (0012) is the rule's, and the planted one-eye reversers make some
    const evidence = attempts.map(a => ruleSwapEvidence({ slips: slipsOf(a.id), torsion: JSON.parse(a.truth_json).torsion, recorded: { RE: a.re_recorded_direction, LE: a.le_recorded_direction } }))
    expect(attempts.map(a => a.rule_swap_eye)).toEqual(evidence)
    expect(evidence.filter(e => e === 'RE').length).toBeGreaterThan(1)
    expect(evidence.filter(e => e === 'LE').length).toBeGreaterThan(1)
  })
})
