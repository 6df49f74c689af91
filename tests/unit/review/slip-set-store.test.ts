// attempts.slip_set (migration 0007) against a from-scratch count: the backfill
// gives every existing attempt the key of its attempt_slips rows, the per-learner
// counts read from it equal countsFromHistory, and the planner answers the
// per-learner queries from their covering indexes without a sort (EXPLAIN QUERY
// PLAN; no timing here — npm run perf:review measures speed).
import SQLite from 'better-sqlite3'
import { Kysely, Migrator, SqliteDialect } from 'kysely'
import type { CompiledQuery } from 'kysely'
import { afterEach, describe, expect, it } from 'vitest'
import { fc } from '@fast-check/vitest'
import type { Slip } from '#shared/engine/slips'
import { ruleSwapEvidence } from '#shared/engine/slips'
import { countsFromHistory } from '#shared/review/patterns'
import { slipSetOf } from '#shared/review/slip-set'
import { reviewFilterQuery } from '#shared/schemas/review'
import { migrateToLatest } from '../../../db/open'
import { staticMigrationProvider } from '../../../db/migrations'
import type { Database } from '../../../db/schema'
import { learnerCounts, needsHelp } from '~~/server/lib/review/learners'
import type { ReviewScope } from '~~/server/lib/review/scope'
import { attemptValues } from '../../support/review-rows'
import { attemptOn, historyArb } from '../../support/slip-histories'

const all: ReviewScope = { cohortIds: null, role: 'lecturer', userId: 0 }
const now = '2026-11-02T10:00:00.000Z'
let sqlite: SQLite.Database
let queries: CompiledQuery[] = []

function open(): Kysely<Database> {
  sqlite = new SQLite(':memory:')
  sqlite.pragma('foreign_keys = ON')
  return new Kysely<Database>({
    dialect: new SqliteDialect({ database: sqlite }),
    log: (e) => {
      if (e.level === 'query') queries.push(e.query)
    },
  })
}
afterEach(() => {
  sqlite?.close()
  queries = []
})

const slipArb = fc.record({
  code: fc.constantFrom('direction-reversed', 'direction-reversed', 'dial-value-as-amount', 'amount-off', 'test-unnamed', 'not-parallel'),
  eye: fc.option(fc.constantFrom('RE', 'LE'), { nil: undefined }),
}).map(s => (s.eye ? { code: s.code, eye: s.eye } : { code: s.code }) as Slip)

async function people(db: Kysely<any>, n: number) {
  const cohorts: number[] = []
  for (const name of ['A', 'B']) cohorts.push((await db.insertInto('cohorts').values({ name, created_at: now, updated_at: now }).returning('id').executeTakeFirstOrThrow()).id)
  const ids: number[] = []
  for (let i = 0; i < n; i++) {
    const { id } = await db.insertInto('users').values({ email: `l${i}@x.test`, name: `Learner ${i}`, role: 'student', password_hash: 'x', created_at: now, updated_at: now }).returning('id').executeTakeFirstOrThrow()
    await db.insertInto('cohort_members').values({ cohort_id: cohorts[i % 2]!, user_id: id, created_at: now }).execute()
    ids.push(id)
  }
  const { id: caseId } = await db.insertInto('cases').values({
    owner_id: ids[0]!, purpose: 'practice', template_id: 'so-palsy-left-standard', seed: 's', generator_version: 1,
    condition: 'so-palsy', difficulty: 'standard', mode: 'learner-turns', created_at: now, updated_at: now,
  }).returning('id').executeTakeFirstOrThrow()
  return { cohorts, ids, caseId }
}

/** Every attempt's slip_set beside the key made from scratch from its attempt_slips rows. */
async function storedAndRecounted(db: Kysely<Database>) {
  const attempts = await db.selectFrom('attempts').select(['id', 'slip_set']).orderBy('id').execute()
  const slipsOf = new Map<number, { code: string, eye: string | null }[]>()
  for (const s of await db.selectFrom('attempt_slips').select(['attempt_id', 'code', 'eye']).execute()) slipsOf.set(s.attempt_id, [...(slipsOf.get(s.attempt_id) ?? []), s])
  return attempts.map(a => ({ id: a.id, stored: a.slip_set, recounted: slipSetOf(slipsOf.get(a.id) ?? []) }))
}

describe('migration 0007', () => {
  it('backfills each attempt\'s slip set from its slip rows, across more than one batch, and the counts follow', async () => {
    const db = open()
    const migrator = new Migrator({ db, provider: staticMigrationProvider, allowUnorderedMigrations: false })
    const before = await migrator.migrateTo('0006_practice_extra')
    expect(before.error).toBeUndefined()
    const { cohorts, ids, caseId } = await people(db, 40)
    // 5,200 attempts: the backfill works in ranges of 5,000 attempt ids
    const histories = fc.sample(fc.array(fc.record({ slips: fc.array(slipArb, { maxLength: 4 }) }), { minLength: 130, maxLength: 130 }), { numRuns: ids.length, seed: 70 })
    const raw = db as unknown as Kysely<any>
    const made = histories.flatMap((history, i) => history.map((a, j) => ({ i, slips: a.slips, values: (({ slip_set: _notYet, rule_swap_eye: _later, ...v }) => v)(attemptValues({
      learnerId: ids[i]!, cohortId: cohorts[i % 2]!, submittedAt: `2026-10-${String(1 + (j % 28)).padStart(2, '0')}T10:00:00.000Z`, slips: a.slips,
    }, caseId)) })))
    await raw.transaction().execute(async (trx) => {
      for (let k = 0; k < made.length; k += 200) {
        const chunk = made.slice(k, k + 200)
        const inserted = await trx.insertInto('attempts').values(chunk.map(m => m.values)).returning('id').execute()
        const slipRows = chunk.flatMap((m, j) => m.slips.map(s => ({
          attempt_id: inserted[j]!.id, learner_id: ids[m.i]!, cohort_id: cohorts[m.i % 2]!, kind: 'practice', quiz_id: null,
          template_id: 'so-palsy-left-standard', condition: 'so-palsy', code: s.code, eye: s.eye ?? null, created_at: m.values.submitted_at,
        })))
        for (let r = 0; r < slipRows.length; r += 300) await trx.insertInto('attempt_slips').values(slipRows.slice(r, r + 300)).execute()
      }
    })
    await migrateToLatest(db)

    const rows = await storedAndRecounted(db)
    expect(rows).toHaveLength(5200)
    expect(rows.filter(r => r.stored !== r.recounted)).toEqual([])
    expect(rows.some(r => r.stored.includes(' '))).toBe(true)
    const counts = await learnerCounts(db, reviewFilterQuery.parse({}), all)
    histories.forEach((h, i) => expect(counts.get(ids[i]!)).toEqual(countsFromHistory(h)))

    // and back down: the column goes, 0004's per-learner index returns
    // (later migrations are undone first)
    const down = await migrator.migrateTo('0006_practice_extra')
    expect(down.error).toBeUndefined()
    expect(down.results?.find(r => r.migrationName === '0007_review_learners')).toMatchObject({ direction: 'Down', status: 'Success' })
    const columns = sqlite.prepare('select name from pragma_table_info(\'attempts\')').all() as { name: string }[]
    expect(columns.map(c => c.name)).not.toContain('slip_set')
    expect(sqlite.prepare('select name from sqlite_master where type = \'index\' and name = \'attempts_rv_learner\'').get()).toBeTruthy()
  })
})

describe('migration 0012', () => {
  it('backfills each attempt\'s rule-swap evidence from its slips, truth and record, across more than one batch, and the counts follow', async () => {
    const db = open()
    const migrator = new Migrator({ db, provider: staticMigrationProvider, allowUnorderedMigrations: false })
    expect((await migrator.migrateTo('0009_quiz_fundus')).error).toBeUndefined()
    const { cohorts, ids, caseId } = await people(db, 40)
    // 5,200 attempts: the backfill works in ranges of 5,000 attempt ids
    const histories = fc.sample(historyArb(['direction-reversed', 'amount-off', 'test-unnamed'], { minLength: 130, maxLength: 130 }), { numRuns: ids.length, seed: 12 })
    const raw = db as unknown as Kysely<any>
    const made = histories.flatMap((history, i) => history.map((a, j) => (({ rule_swap_eye: _notYet, ...v }) => v)(attemptValues({
      learnerId: ids[i]!, cohortId: cohorts[i % 2]!, submittedAt: `2026-10-${String(1 + (j % 28)).padStart(2, '0')}T10:00:00.000Z`, slips: a.slips,
      torsion: a.torsion, reRecorded: a.recorded.RE, leRecorded: a.recorded.LE,
    }, caseId))))
    for (let k = 0; k < made.length; k += 200) await raw.insertInto('attempts').values(made.slice(k, k + 200)).execute()
    await migrateToLatest(db)

    const stored = (await db.selectFrom('attempts').select('rule_swap_eye').orderBy('id').execute()).map(r => r.rule_swap_eye)
    const expected = histories.flatMap(h => h.map(a => ruleSwapEvidence(a)))
    expect(stored).toHaveLength(5200)
    expect(stored).toEqual(expected)
    expect(stored.filter(e => e === 'RE').length).toBeGreaterThan(50)
    expect(stored.filter(e => e === 'LE').length).toBeGreaterThan(50)
    // 0007's per-learner index is left as it was
    expect((sqlite.prepare('select sql from sqlite_master where name = \'attempts_rv_slip_set\'').get() as { sql: string }).sql).not.toMatch(/rule_swap_eye/)
    const counts = await learnerCounts(db, reviewFilterQuery.parse({}), all)
    histories.forEach((h, i) => expect(counts.get(ids[i]!)).toEqual(countsFromHistory(h)))

    const down = await migrator.migrateTo('0009_quiz_fundus')
    expect(down.error).toBeUndefined()
    const columns = sqlite.prepare('select name from pragma_table_info(\'attempts\')').all() as { name: string }[]
    expect(columns.map(c => c.name)).not.toContain('rule_swap_eye')
    expect(sqlite.prepare('select name from sqlite_master where type = \'index\' and name = \'attempts_rv_rule_swap\'').get()).toBeUndefined()
  })
})

describe('query plans for who needs help', () => {
  const plan = (q: CompiledQuery) => (sqlite.prepare(`explain query plan ${q.sql}`).all(...q.parameters as unknown[]) as { detail: string }[]).map(r => r.detail)

  it('counts per learner from attempts_rv_slip_set, and the rule-swap evidence from the partial attempts_rv_rule_swap, each grouped without a sort, for every scope and filter', async () => {
    const db = open()
    await migrateToLatest(db)
    const { cohorts } = await people(db, 2)
    const views: [Record<string, string>, ReviewScope][] = [
      [{}, all], [{}, { ...all, cohortIds: [cohorts[0]!] }], [{}, { ...all, cohortIds: cohorts }],
      [{ kind: 'quiz', from: '2026-10-01', to: '2026-10-31' }, all], [{ template: 'so-palsy-left', condition: 'so-palsy' }, { ...all, cohortIds: [cohorts[1]!] }],
    ]
    for (const [filters, scope] of views) {
      queries = []
      await learnerCounts(db, reviewFilterQuery.parse(filters), scope)
      expect(queries).toHaveLength(2)
      const steps = plan(queries[0]!)
      expect(steps.join(' | '), JSON.stringify(filters)).toMatch(/^SEARCH attempts USING COVERING INDEX attempts_rv_slip_set \(cohort_id/)
      expect(steps.join(' | ')).not.toMatch(/TEMP B-TREE/)
      const evidence = plan(queries[1]!).join(' | ')
      expect(evidence, JSON.stringify(filters)).toMatch(/^SEARCH attempts USING COVERING INDEX attempts_rv_rule_swap \(cohort_id/)
      expect(evidence).not.toMatch(/TEMP B-TREE/)
    }
  })

  it('finds the examples from attempt_slips_rv_learner, reading only the listed learners', async () => {
    const db = open()
    await migrateToLatest(db)
    const { cohorts, ids, caseId } = await people(db, 2)
    // two one-eye reversals and three dial figures for the first learner: two patterns, so two example subqueries
    for (const [k, slips] of [[{ code: 'direction-reversed', eye: 'LE' }], [{ code: 'direction-reversed', eye: 'LE' }], [{ code: 'dial-value-as-amount', eye: 'RE' }], [{ code: 'dial-value-as-amount', eye: 'RE' }], [{ code: 'dial-value-as-amount', eye: 'RE' }]].entries()) {
      const values = attemptValues({ learnerId: ids[0]!, cohortId: cohorts[0]!, submittedAt: `2026-10-0${k + 1}T10:00:00.000Z`, slips: slips as Slip[] }, caseId)
      const { id } = await db.insertInto('attempts').values(values).returning('id').executeTakeFirstOrThrow()
      await db.insertInto('attempt_slips').values((slips as Slip[]).map(s => ({ attempt_id: id, learner_id: ids[0]!, cohort_id: cohorts[0]!, kind: 'practice' as const, quiz_id: null, template_id: 'so-palsy-left-standard', condition: 'so-palsy', code: s.code, eye: s.eye ?? null, created_at: values.submitted_at }))).execute()
    }
    queries = []
    const { items } = await needsHelp(db, reviewFilterQuery.parse({}), all, 50)
    // (one-eye reversals with no truth to tell a rule swap apart count as recording the image: issue 11)
    expect(items.map(i => i.patterns.map(p => [p.code, p.examples.length]))).toEqual([[['image-recorded', 2], ['dial-value-as-amount', 3]]])
    const examples = queries.at(-1)!
    expect(examples.sql).toMatch(/union all/)
    const steps = plan(examples).filter(s => s.startsWith('SEARCH') || s.startsWith('SCAN attempt'))
    expect(steps).toHaveLength(2)
    for (const s of steps) expect(s).toMatch(/^SEARCH attempt_slips USING COVERING INDEX attempt_slips_rv_learner \(cohort_id=\? AND learner_id=\? AND code=\?/)
  })

  it('finds a rule swap\'s examples among the learner\'s telling attempts only, from the partial index attempts_rv_rule_swap', async () => {
    const db = open()
    await migrateToLatest(db)
    const { cohorts, ids, caseId } = await people(db, 2)
    // three left-eye reversals beside a torted, rightly recorded right eye, then one on a left-eye-only case (newest)
    const made = [
      attemptOn({ RE: 6, LE: -4 }, ['LE']), attemptOn({ RE: 5, LE: 3 }, ['LE']), attemptOn({ RE: -3, LE: 7 }, ['LE']), attemptOn({ RE: 0.5, LE: 6 }, ['LE']),
    ]
    const attemptIds: number[] = []
    for (const [k, a] of made.entries()) {
      const values = attemptValues({ learnerId: ids[0]!, cohortId: cohorts[0]!, submittedAt: `2026-10-0${k + 1}T10:00:00.000Z`, slips: a.slips, torsion: a.torsion, reRecorded: a.recorded.RE, leRecorded: a.recorded.LE }, caseId)
      const { id } = await db.insertInto('attempts').values(values).returning('id').executeTakeFirstOrThrow()
      await db.insertInto('attempt_slips').values(a.slips.map(s => ({ attempt_id: id, learner_id: ids[0]!, cohort_id: cohorts[0]!, kind: 'practice' as const, quiz_id: null, template_id: 'so-palsy-left-standard', condition: 'so-palsy', code: s.code, eye: s.eye ?? null, created_at: values.submitted_at }))).execute()
      attemptIds.push(id)
    }
    queries = []
    const { items } = await needsHelp(db, reviewFilterQuery.parse({}), all, 50)
    expect(items).toHaveLength(1)
    expect(items[0]!.patterns).toEqual([expect.objectContaining({ code: 'left-right-rule-swapped', eye: 'LE', count: 3, of: 4 })])
    // newest telling attempt first; the left-eye-only case is not an example
    expect(items[0]!.patterns[0]!.examples).toEqual([attemptIds[2], attemptIds[1], attemptIds[0]])
    const steps = plan(queries.at(-1)!).filter(s => s.startsWith('SEARCH') || s.startsWith('SCAN attempt'))
    expect(steps).toEqual([expect.stringMatching(/^SEARCH attempts USING COVERING INDEX attempts_rv_rule_swap \(cohort_id=\? AND learner_id=\? AND rule_swap_eye=\?/)])
  })
})
