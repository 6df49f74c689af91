// npm run perf:review — the slip-patterns review at scale (issue 6, item 6).
// Seeds 200,000 attempts across 600 learners into a temporary SQLite file,
// starts the BUILT server on it, and times the review API over HTTP for several
// filtered views. Prints the median (and p90) of each view and the ratio to a
// trivial route measured in the same run; fails when a median reaches 100 ms.
import { existsSync, mkdtempSync, rmSync, statSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import SQLite from 'better-sqlite3'
import { afterAll, expect, it } from 'vitest'
import { migrateToLatest, openDatabase } from '../../db/open'
import { Client, DEMO } from '../support/client'
import { startServer } from '../support/server'
import type { RunningServer } from '../support/server'
import { reusedBulk, writeBulk } from './review-data'

const PLAN = { learners: 600, attempts: 200_000, cohorts: 6, weeks: 26, quizzesPerCohort: 2, end: new Date('2026-12-01T00:00:00Z') }
const RUNS = 21
const BUDGET_MS = 100

let server: RunningServer | undefined
const dir = mkdtempSync(join(tmpdir(), 'cyclodial-bench-review-'))
afterAll(async () => {
  await server?.stop()
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

it('times the review API at 200,000 attempts', async () => {
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
  console.log(`seeded ${counts.attempts} attempts, ${made.slipRows} slips, ${counts.learners} learners in ${(seeded / 1000).toFixed(1)} s; file ${(statSync(dbPath).size / 1e6).toFixed(0)} MB`)
  expect(counts.attempts).toBe(PLAN.attempts)
  expect(counts.learners).toBe(PLAN.learners)
  sqlite.close()

  server = await startServer({ dbPath })
  if (reuse) await new Promise(r => setTimeout(r, 100))
  // the demo tutor also teaches two of the bench cohorts, so tutor-scoped views cover 200 learners
  const link = new SQLite(dbPath)
  const tutor = link.prepare('select id from users where email = ?').get(DEMO.tutor) as { id: number }
  for (const c of made.cohortIds.slice(0, 2)) link.prepare('insert or ignore into cohort_members (cohort_id, user_id, created_at) values (?, ?, ?)').run(c, tutor.id, new Date().toISOString())
  link.close()

  const lecturer = new Client(server.baseURL)
  await lecturer.signIn(DEMO.lecturer)
  const tutorClient = new Client(server.baseURL)
  await tutorClient.signIn(DEMO.tutor)
  const c1 = made.cohortIds[0]!
  const c3 = made.cohortIds[2]!
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
  const rows: { view: string, median: number, p90: number }[] = []
  for (const [view, client, path] of views) {
    const t = await time(client, path)
    rows.push({ view, median: median(t), p90: p90(t) })
  }
  const floor = rows[0]!.median
  console.log(`\nreview API over HTTP, ${RUNS} runs per view after 2 warm-ups (built server, ${PLAN.attempts} attempts)`)
  console.log(`${'view'.padEnd(44)} ${'median ms'.padStart(10)} ${'p90 ms'.padStart(8)} ${'× floor'.padStart(8)}`)
  for (const r of rows) console.log(`${r.view.padEnd(44)} ${r.median.toFixed(1).padStart(10)} ${r.p90.toFixed(1).padStart(8)} ${(r.median / floor).toFixed(1).padStart(8)}`)
  const over = rows.slice(1).filter(r => r.median >= BUDGET_MS)
  expect(over, `views with a median of ${BUDGET_MS} ms or more`).toEqual([])
}, 900_000)
