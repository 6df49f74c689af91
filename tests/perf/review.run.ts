// npm run perf:review — the slip-patterns review at scale (issue 6, item 6; issue 15).
// Seeds 200,000 attempts across 600 learners into a temporary SQLite file,
// starts the BUILT server on it, and times the review API over HTTP for several
// filtered views. With CYCLODIAL_TEST_PG_URL set or a cluster of scripts/pg-cluster.sh running, it
// then does the same on a fresh PostgreSQL database of that cluster (same data,
// written in batched inserts) and prints both side by side. Prints the median
// (and p90) of each view and the ratio to a trivial route measured in the same
// run; fails when a median reaches 100 ms on either database.
import { existsSync, mkdtempSync, rmSync, statSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import SQLite from 'better-sqlite3'
import pg from 'pg'
import { afterAll, expect, it } from 'vitest'
import { migrateToLatest, openDatabase, openPostgres } from '../../db/open'
import { Client, DEMO } from '../support/client'
import { createTestDatabase } from '../support/pg'
import type { TestDatabase } from '../support/pg'
import { startServer } from '../support/server'
import type { RunningServer } from '../support/server'
import { benchPgUrl } from './pg-target'
import { reusedBulk, reusedBulkPg, writeBulk, writeBulkPg } from './review-data'

const PLAN = { learners: 600, attempts: 200_000, cohorts: 6, weeks: 26, quizzesPerCohort: 2, end: new Date('2026-12-01T00:00:00Z') }
const RUNS = 21
const BUDGET_MS = 100

const cleanups: (() => Promise<void>)[] = []
const dir = mkdtempSync(join(tmpdir(), 'cyclodial-bench-review-'))
afterAll(async () => {
  for (const c of cleanups.reverse()) await c().catch(e => console.error(e))
  rmSync(dir, { recursive: true, force: true })
})

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!
const p90 = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length * 0.9)]!

async function time(client: Client, path: string): Promise<number[]> {
  for (let i = 0; i < 2; i++) {
    const warm = await client.get(path)
    if (warm.status !== 200) throw new Error(`${path} → ${warm.status} ${JSON.stringify(warm.body).slice(0, 300)}`)
  }
  const out: number[] = []
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now()
    const r = await client.get(path)
    out.push(performance.now() - t0)
    if (r.status !== 200) throw new Error(`${path} → ${r.status}`)
  }
  return out
}

interface Row { view: string, median: number, p90: number }
interface Seeded { server: RunningServer, cohortIds: number[], stop: () => Promise<void> }

/** SQLite: a temporary file (or REVIEW_BENCH_DB, kept and reused), the built server on it. */
async function seedSqlite(): Promise<Seeded> {
  // REVIEW_BENCH_DB=path keeps the seeded file for query work (and reuses it when it exists)
  const keep = process.env.REVIEW_BENCH_DB
  const dbPath = keep ?? join(dir, 'bench.sqlite')
  const reuse = !!keep && existsSync(keep)
  const kysely = openDatabase(dbPath)
  await migrateToLatest(kysely)
  await kysely.destroy()

  const sqlite = new SQLite(dbPath)
  sqlite.pragma('journal_mode = WAL')
  const t0 = performance.now()
  const made = reuse ? reusedBulk(sqlite) : writeBulk(sqlite, PLAN)
  const seeded = performance.now() - t0
  // the benchmark's own cohorts (a reused file also holds the demo school's attempts)
  const counts = sqlite.prepare(`select count(*) as attempts, count(distinct learner_id) as learners from attempts
    where cohort_id in (select id from cohorts where name like 'Bench cohort %')`).get() as { attempts: number, learners: number }
  console.log(`SQLite: seeded ${counts.attempts} attempts, ${made.slipRows} slips, ${counts.learners} learners in ${(seeded / 1000).toFixed(1)} s; file ${(statSync(dbPath).size / 1e6).toFixed(0)} MB`)
  expect(counts.attempts).toBe(PLAN.attempts)
  expect(counts.learners).toBe(PLAN.learners)
  sqlite.close()

  const server = await startServer({ dbPath })
  if (reuse) await new Promise(r => setTimeout(r, 100))
  // the demo tutor also teaches two of the bench cohorts, so tutor-scoped views cover 200 learners
  const link = new SQLite(dbPath)
  const tutor = link.prepare('select id from users where email = ?').get(DEMO.tutor) as { id: number }
  for (const c of made.cohortIds.slice(0, 2)) link.prepare('insert or ignore into cohort_members (cohort_id, user_id, created_at) values (?, ?, ?)').run(c, tutor.id, new Date().toISOString())
  link.close()
  return { server, cohortIds: made.cohortIds, stop: () => server.stop() }
}

/** REVIEW_BENCH_PG_DB=name: a database of that name on the cluster, kept afterwards and reused when it holds the data. */
async function keptPgDatabase(adminUrl: string, name: string): Promise<{ url: string, reuse: boolean }> {
  if (!/^[a-z_][a-z0-9_]{0,62}$/.test(name)) throw new Error('REVIEW_BENCH_PG_DB must be a plain lower-case database name')
  const u = new URL(adminUrl)
  u.pathname = `/${name}`
  const admin = new pg.Client({ connectionString: adminUrl })
  await admin.connect()
  try {
    const exists = (await admin.query('select 1 from pg_database where datname = $1', [name])).rowCount
    if (!exists) await admin.query(`create database ${name}`)
  }
  finally {
    await admin.end()
  }
  const probe = new pg.Client({ connectionString: u.toString() })
  await probe.connect()
  try {
    const seeded = await probe.query('select 1 from cohorts where name like \'Bench cohort %\' limit 1').then(r => r.rowCount! > 0, () => false)
    return { url: u.toString(), reuse: seeded }
  }
  finally {
    await probe.end()
  }
}

/** PostgreSQL: a fresh database on the test cluster (or REVIEW_BENCH_PG_DB), the same data, the built server on it. */
async function seedPostgres(adminUrl: string): Promise<Seeded> {
  let url: string
  let reuse = false
  if (process.env.REVIEW_BENCH_PG_DB) ({ url, reuse } = await keptPgDatabase(adminUrl, process.env.REVIEW_BENCH_PG_DB))
  else {
    const database: TestDatabase = await createTestDatabase(adminUrl)
    cleanups.push(() => database.drop())
    url = database.url
  }
  const kysely = openPostgres(url)
  await migrateToLatest(kysely)
  await kysely.destroy()

  const client = new pg.Client({ connectionString: url })
  await client.connect()
  try {
    const t0 = performance.now()
    const made = reuse ? await reusedBulkPg(client) : await writeBulkPg(client, PLAN)
    const seeded = performance.now() - t0
    const counts = (await client.query(`select count(*)::int as attempts, count(distinct learner_id)::int as learners from attempts
      where cohort_id in (select id from cohorts where name like 'Bench cohort %')`)).rows[0] as { attempts: number, learners: number }
    const size = (await client.query('select pg_database_size(current_database())::bigint as b')).rows[0].b
    console.log(`PostgreSQL: ${reuse ? `reused ${process.env.REVIEW_BENCH_PG_DB} with` : 'seeded'} ${counts.attempts} attempts, ${made.slipRows} slips, ${counts.learners} learners${reuse ? '' : ` in ${(seeded / 1000).toFixed(1)} s (incl. VACUUM ANALYZE)`}; database ${(Number(size) / 1e6).toFixed(0)} MB`)
    expect(counts.attempts).toBe(PLAN.attempts)
    expect(counts.learners).toBe(PLAN.learners)

    const server = await startServer({ databaseUrl: url })
    const tutor = (await client.query('select id from users where email = $1', [DEMO.tutor])).rows[0] as { id: number }
    for (const c of made.cohortIds.slice(0, 2)) {
      await client.query('insert into cohort_members (cohort_id, user_id, created_at) values ($1, $2, $3) on conflict do nothing', [c, tutor.id, new Date().toISOString()])
    }
    return { server, cohortIds: made.cohortIds, stop: () => server.stop() }
  }
  finally {
    await client.end()
  }
}

async function measure(s: Seeded): Promise<Row[]> {
  const lecturer = new Client(s.server.baseURL)
  await lecturer.signIn(DEMO.lecturer)
  const tutorClient = new Client(s.server.baseURL)
  await tutorClient.signIn(DEMO.tutor)
  const c1 = s.cohortIds[0]!
  const c3 = s.cohortIds[2]!
  const views: [string, Client, string][] = [
    ['floor: GET /api/health', lecturer, '/api/health'],
    ['slips · all cohorts', lecturer, '/api/review/slips'],
    ['slips · one cohort', lecturer, `/api/review/slips?cohortId=${c1}`],
    ['slips · cohort + practice + 8 weeks', lecturer, `/api/review/slips?cohortId=${c3}&kind=practice&from=2026-10-06&to=2026-11-30`],
    ['slips · template + left eye', lecturer, '/api/review/slips?template=so-palsy-left&eye=LE'],
    ['slips · one quiz', lecturer, `/api/review/slips?quizId=3`],
    ['slips · condition, all cohorts', lecturer, '/api/review/slips?condition=io-palsy'],
    ['amounts · all cohorts', lecturer, '/api/review/amounts'],
    ['amounts · one cohort, right eye', lecturer, `/api/review/amounts?cohortId=${c1}&eye=RE`],
    ['trend · all cohorts', lecturer, '/api/review/trend'],
    ['trend · one cohort, quizzes', lecturer, `/api/review/trend?cohortId=${c1}&kind=quiz`],
    ['learners · all cohorts', lecturer, '/api/review/learners'],
    ['learners · one cohort', lecturer, `/api/review/learners?cohortId=${c1}`],
    ['drill-down · reversals in one cohort', lecturer, `/api/review/attempts?cohortId=${c1}&code=direction-reversed&eye=LE`],
    ['drill-down · direction cell, all cohorts', lecturer, '/api/review/attempts?eye=LE&trueDirection=excyclo&recordedDirection=incyclo'],
    ['drill-down · every attempt, all cohorts', lecturer, '/api/review/attempts'],
    ['tutor · slips (2 cohorts)', tutorClient, '/api/review/slips'],
    ['tutor · learners (2 cohorts)', tutorClient, '/api/review/learners'],
  ]
  const rows: Row[] = []
  for (const [view, client, path] of views) {
    const t = await time(client, path)
    rows.push({ view, median: median(t), p90: p90(t) })
  }
  return rows
}

it('times the review API at 200,000 attempts, on SQLite and (when a cluster is given) PostgreSQL', async () => {
  const results: { name: string, rows: Row[] }[] = []
  // one database at a time: each server is stopped before the next one is seeded;
  // REVIEW_BENCH_ONLY=postgres skips SQLite (to re-measure a kept REVIEW_BENCH_PG_DB)
  if (process.env.REVIEW_BENCH_ONLY !== 'postgres') {
    const sqlite = await seedSqlite()
    cleanups.push(sqlite.stop)
    results.push({ name: 'SQLite', rows: await measure(sqlite) })
    await sqlite.stop()
  }
  const pgUrl = await benchPgUrl()
  if (pgUrl) {
    const postgres = await seedPostgres(pgUrl)
    cleanups.push(postgres.stop)
    results.push({ name: 'PostgreSQL', rows: await measure(postgres) })
    await postgres.stop()
  }
  else {
    if (!results.length) throw new Error('REVIEW_BENCH_ONLY=postgres needs a PostgreSQL cluster (CYCLODIAL_TEST_PG_URL or scripts/pg-cluster.sh start)')
    console.log('PostgreSQL: not measured (set CYCLODIAL_TEST_PG_URL, e.g. eval "$(bash scripts/pg-cluster.sh start)")')
  }

  console.log(`\nreview API over HTTP, ${RUNS} runs per view after 2 warm-ups (built server, ${PLAN.attempts} attempts); ms, × = median ÷ the same database's health median`)
  const head = results.map(r => `${`${r.name} median`.padStart(18)} ${'p90'.padStart(7)} ${'×'.padStart(6)}`).join(' ')
  console.log(`${'view'.padEnd(44)} ${head}`)
  results[0]!.rows.forEach((row, i) => {
    const cells = results.map((r) => {
      const x = r.rows[i]!
      return `${x.median.toFixed(1).padStart(18)} ${x.p90.toFixed(1).padStart(7)} ${(x.median / r.rows[0]!.median).toFixed(1).padStart(6)}`
    })
    console.log(`${row.view.padEnd(44)} ${cells.join(' ')}`)
  })
  for (const r of results) {
    const over = r.rows.slice(1).filter(x => x.median >= BUDGET_MS)
    expect(over, `${r.name}: views with a median of ${BUDGET_MS} ms or more`).toEqual([])
  }
}, 1_800_000)
