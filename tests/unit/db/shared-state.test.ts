// Nothing per-process that must be shared (issue 15, point 2): sign-in limits and
// the mail retry lease live in the database. On SQLite one handle (one process owns
// the file); on PostgreSQL (when CYCLODIAL_TEST_PG_URL names a cluster) two pools
// on one database stand for two instances behind a load balancer.
import type { Kysely } from 'kysely'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { migrateToLatest, openConfiguredDatabase, openDatabase } from '../../../db/open'
import type { Database } from '../../../db/schema'
import { MAX_FAILURES_PER_EMAIL_AND_IP, SLOW_AFTER_FAILURES_PER_IP, reserveLoginAttempt, settleLoginAttempt } from '../../../server/utils/rate-limit'
import { claimDueMailJobs, claimMailJob } from '../../../server/utils/mail'
import { createTestDatabase, testPgUrl, type TestDatabase } from '../../support/pg'

interface Target { name: string, a: Kysely<Database>, b: Kysely<Database>, close: () => Promise<void> }
const targets: Target[] = []

beforeAll(async () => {
  const sqlite = openDatabase(':memory:')
  await migrateToLatest(sqlite)
  targets.push({ name: 'sqlite', a: sqlite, b: sqlite, close: () => sqlite.destroy() })
  const adminUrl = testPgUrl()
  if (adminUrl) {
    const pgDb: TestDatabase = await createTestDatabase(adminUrl)
    const a = openConfiguredDatabase({ databaseUrl: pgDb.url, dbPath: '' })
    const b = openConfiguredDatabase({ databaseUrl: pgDb.url, dbPath: '' })
    await migrateToLatest(a)
    targets.push({ name: 'postgres (two pools)', a, b, close: async () => {
      await a.destroy()
      await b.destroy()
      await pgDb.drop()
    } })
  }
}, 60_000)

afterAll(async () => {
  for (const t of targets) await t.close()
})

describe('sign-in limits in the database', () => {
  it('lets at most the limit of 20 simultaneous tries through, whichever instance takes them', async () => {
    for (const t of targets) {
      const email = `burst-${t.name.length}@example.test`
      const tries = await Promise.all(Array.from({ length: 20 }, (_, i) => reserveLoginAttempt(i % 2 ? t.b : t.a, email, '203.0.113.7')))
      const through = tries.filter(r => !r.limited)
      expect(through.length, t.name).toBe(MAX_FAILURES_PER_EMAIL_AND_IP)
      for (const r of through) await settleLoginAttempt(t.a, r.attemptId)
    }
  })

  it('counts settled failures from one address towards its slow-down, not attempts still being checked', async () => {
    for (const t of targets) {
      const ip = `198.51.100.${t.name.length}`
      // pending reservations (passwords still being checked) do not slow the address down
      const pending = await Promise.all(Array.from({ length: SLOW_AFTER_FAILURES_PER_IP }, (_, i) => reserveLoginAttempt(i % 2 ? t.b : t.a, `p${i}@example.test`, ip)))
      const whilePending = await reserveLoginAttempt(t.b, 'someone@example.test', ip)
      expect(whilePending.delayMs, t.name).toBe(0)
      // once decided as failures (through either instance), they do
      for (const [i, r] of pending.entries()) await settleLoginAttempt(i % 2 ? t.a : t.b, r.attemptId)
      await settleLoginAttempt(t.a, whilePending.attemptId)
      const after = await reserveLoginAttempt(t.a, 'someone-else@example.test', ip)
      expect(after.delayMs, t.name).toBeGreaterThan(0)
    }
  })
})

describe('the mail retry lease', () => {
  async function queue(db: Kysely<Database>, n: number, tag: string): Promise<number[]> {
    const now = new Date(Date.now() - 1000).toISOString()
    const ids: number[] = []
    for (let i = 0; i < n; i++) {
      const row = await db.insertInto('mail_jobs').values({ to_address: `${tag}${i}@example.test`, subject: 's', text_body: 't', html_body: null, status: 'pending', attempts: 0, next_attempt_at: now, created_at: now })
        .returning('id').executeTakeFirstOrThrow()
      ids.push(row.id)
    }
    return ids
  }

  it('gives one job to one instance only', async () => {
    for (const t of targets) {
      const [id] = await queue(t.a, 1, 'one')
      const claims = await Promise.all([claimMailJob(t.a, id!), claimMailJob(t.b, id!), claimMailJob(t.a, id!), claimMailJob(t.b, id!)])
      expect(claims.filter(Boolean).length, t.name).toBe(1)
    }
  })

  it('splits due jobs between instances retrying at the same moment: every job once, none twice', async () => {
    for (const t of targets) {
      await t.a.updateTable('mail_jobs').set({ status: 'sent' }).execute()
      const ids = await queue(t.a, 30, 'due')
      const [x, y] = await Promise.all([claimDueMailJobs(t.a, 20), claimDueMailJobs(t.b, 20)])
      const taken = [...x!, ...y!]
      expect(new Set(taken).size, t.name).toBe(taken.length)
      // whatever one round left is taken by the next, and nothing is ever taken twice
      const rest = [...await claimDueMailJobs(t.b, 50), ...await claimDueMailJobs(t.a, 50)]
      expect([...taken, ...rest].sort((p, q) => p - q), t.name).toEqual(ids)
      expect(await claimDueMailJobs(t.a, 50)).toEqual([])
    }
  })

  it('lets another instance take a job whose lease ran out (the holder died mid-send)', async () => {
    for (const t of targets) {
      const [id] = await queue(t.a, 1, 'stale')
      expect(await claimMailJob(t.a, id!)).toBe(true)
      expect(await claimMailJob(t.b, id!, new Date(Date.now() + 60_000))).toBe(false)
      expect(await claimMailJob(t.b, id!, new Date(Date.now() + 301_000)), t.name).toBe(true) // MAIL_LEASE_SECONDS = 300
    }
  })
})
