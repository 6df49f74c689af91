// npm run bench:quiz — 300 student sessions submit their quiz attempts in the same
// second to the BUILT server. Prints how many were stored (must be all 300), p50
// and p99 latency of the submissions, the same burst on a trivial route for a floor,
// and the server's peak memory (VmHWM from /proc). Never part of npm test.
// With CYCLODIAL_TEST_PG_URL set (scripts/pg-cluster.sh start) it runs on a fresh
// PostgreSQL database; BENCH_INSTANCES=2 then starts a second instance on the same
// database and sends every other student's requests to it (one site, as behind a
// load balancer).
import { readFileSync, mkdtempSync, rmSync } from 'node:fs'
import { cpus, tmpdir } from 'node:os'
import { join } from 'node:path'
import { performance } from 'node:perf_hooks'
import type { Client } from '../support/client'
import { DEMO, signedIn } from '../support/client'
import { readDb } from '../support/db'
import { testPgUrl } from '../support/pg'
import { freePort, startServer, type RunningServer } from '../support/server'

const STUDENTS = Number(process.env.BENCH_STUDENTS ?? 300)
const INSTANCES = Number(process.env.BENCH_INSTANCES ?? 1)
if (INSTANCES !== 1 && INSTANCES !== 2) throw new Error('BENCH_INSTANCES is 1 or 2')
if (INSTANCES === 2 && !testPgUrl()) throw new Error('BENCH_INSTANCES=2 needs PostgreSQL (CYCLODIAL_TEST_PG_URL): one SQLite file belongs to one process')
const quantile = (xs: number[], q: number) => {
  const s = [...xs].sort((a, b) => a - b)
  return s[Math.min(s.length - 1, Math.ceil(q * s.length) - 1)] ?? Number.NaN
}
const memory = (pid: number) => {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8')
  const kb = (key: string) => Number(status.match(new RegExp(`${key}:\\s+(\\d+) kB`))?.[1] ?? Number.NaN)
  return { rssMb: kb('VmRSS') / 1024, hwmMb: kb('VmHWM') / 1024 }
}
const sleepUntil = (t: number) => new Promise(r => setTimeout(r, Math.max(0, t - Date.now())))
async function inBatches<T>(items: T[], size: number, work: (item: T, i: number) => Promise<void>) {
  for (let i = 0; i < items.length; i += size) await Promise.all(items.slice(i, i + size).map((x, j) => work(x, i + j)))
}

const dir = mkdtempSync(join(tmpdir(), 'cyclodial-bench-quiz-'))
const dbPath = join(dir, 'cyclodial.sqlite')
const port = await freePort()
const site = { NUXT_MAIL_CATCHER: '0', NUXT_PUBLIC_SITE_URL: `http://127.0.0.1:${port}` }
const server = await startServer(testPgUrl() ? { port, env: site } : { dbPath, port, env: site })
const servers: RunningServer[] = [server]
const pid = server.process.pid!
try {
  if (INSTANCES === 2) servers.push(await startServer({ databaseUrl: server.databaseUrl!, env: site }))
  console.log(`Cyclodial quiz benchmark — Node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}; ${server.databaseUrl ? 'PostgreSQL' : 'SQLite'}, ${INSTANCES} instance(s)`)

  // 300 invented students in a cohort of their own, sharing the demo password's hash
  const db = readDb(server.dbPath, { write: true })
  const now = new Date().toISOString()
  const hash = db.get<{ password_hash: string }>('SELECT password_hash FROM users WHERE email = ?', DEMO.student)!.password_hash
  const cohortId = db.get<{ id: number }>('INSERT INTO cohorts (name, created_at, updated_at) VALUES (?, ?, ?) RETURNING id', 'Bench cohort', now, now)!.id
  const emails = Array.from({ length: STUDENTS }, (_, i) => `bench.student.${i + 1}@cyclodial.test`)
  const ids = db.all<{ id: number }>(`INSERT INTO users (email, name, role, password_hash, disabled, created_at, updated_at) VALUES ${emails.map(() => '(?, ?, \'student\', ?, 0, ?, ?)').join(', ')} RETURNING id`,
    ...emails.flatMap((email, i) => [email, `Bench Student ${i + 1}`, hash, now, now])).map(r => r.id)
  db.run(`INSERT INTO cohort_members (cohort_id, user_id, created_at) VALUES ${ids.map(() => '(?, ?, ?)').join(', ')}`, ...ids.flatMap(id => [cohortId, id, now]))

  const lecturer = await signedIn(server.baseURL, DEMO.lecturer)
  const quiz = (await lecturer.post('/api/quizzes', {
    title: 'Benchmark quiz',
    opensAt: new Date(Date.now() - 60_000).toISOString(),
    closesAt: new Date(Date.now() + 3_600_000).toISOString(),
    timeLimitMinutes: 60,
    cohortIds: [cohortId],
  })).body
  const item = (await lecturer.post(`/api/quizzes/${quiz.id}/items`, { kind: 'dmr', source: { type: 'engine', templateId: 'so-palsy-right-standard' }, mode: 'learner-turns' })).body.items[0]
  await lecturer.patch(`/api/quizzes/${quiz.id}`, { published: true })

  // each session signs in, starts the quiz, opens the item and autosaves once
  const t0 = performance.now()
  const sessions: { client: Client, body: Record<string, unknown> }[] = []
  await inBatches(emails, 10, async (email, i) => {
    // every other student through the second instance, when there is one (the session is shared)
    const client = (await signedIn(server.baseURL, email)).copyTo(servers[i % servers.length]!.baseURL)
    await client.post(`/api/quizzes/${quiz.id}/start`)
    const got = (await client.get(`/api/quizzes/${quiz.id}/items/${item.id}`)).body
    const level = got.presentation.positions.primary.horizontalAt as { RE: number, LE: number }
    const readings = { RE: Math.round(level.RE), LE: Math.round(level.LE) }
    const t = { RE: readings.RE - 90, LE: 90 - readings.LE }
    const eye = (e: 'RE' | 'LE') => (Math.round(Math.abs(t[e])) === 0 ? `${e} no torsion` : `${e} ${Math.round(Math.abs(t[e]))}° ${t[e] > 0 ? 'excyclotorsion' : 'incyclotorsion'}`)
    const body = { gaze: 'primary', distance: 'near', readings, prisms: [], lights: 'dim', record: `DMR, near, primary position: ${eye('RE')}, ${eye('LE')}.` }
    await client.put(`/api/quizzes/${quiz.id}/items/${item.id}/draft`, body)
    sessions.push({ client, body })
  })
  console.log(`\n${sessions.length} sessions signed in, started and autosaved in ${((performance.now() - t0) / 1000).toFixed(1)} s.`)
  const before = memory(pid)

  // the burst: every session submits at the same instant
  const burst = async (label: string, send: (s: typeof sessions[number]) => Promise<{ status: number }>) => {
    const at = Date.now() + 1000
    await sleepUntil(at)
    const start = performance.now()
    const results = await Promise.all(sessions.map(async (s) => {
      const t = performance.now()
      const r = await send(s).catch(() => ({ status: 0 }))
      return { status: r.status, ms: performance.now() - t }
    }))
    const wall = performance.now() - start
    const ms = results.map(r => r.ms)
    return { label, ok: results.filter(r => r.status >= 200 && r.status < 300).length, statuses: [...new Set(results.map(r => r.status))], p50: quantile(ms, 0.5), p99: quantile(ms, 0.99), wall }
  }
  const floor = await burst('GET /api/health (trivial route, floor)', s => s.client.get('/api/health'))
  const submit = await burst('POST …/items/:itemId/attempts', s => s.client.post(`/api/quizzes/${quiz.id}/items/${item.id}/attempts`, s.body))
  const after = memory(pid)
  const stored = db.count('SELECT count(*) AS n FROM attempts WHERE quiz_id = ? AND kind = \'quiz\'', quiz.id)
  const slips = db.count('SELECT count(*) AS n FROM attempt_slips WHERE quiz_id = ?', quiz.id)
  db.close()

  console.log(`\n${STUDENTS} requests fired in the same instant (Node fetch, loopback):`)
  for (const r of [floor, submit]) {
    console.log(`  ${r.label.padEnd(40)} ${String(r.ok).padStart(4)} ok   p50 ${r.p50.toFixed(0).padStart(5)} ms   p99 ${r.p99.toFixed(0).padStart(5)} ms   all answered in ${r.wall.toFixed(0)} ms   statuses ${r.statuses.join(', ')}`)
  }
  console.log(`  ratio p50 (submission ÷ trivial route): ${(submit.p50 / floor.p50).toFixed(1)}×`)
  console.log(`\nStored: ${stored} of ${STUDENTS} attempts (${slips} slips rows) — ${stored === STUDENTS ? 'all stored' : 'SOME LOST'}`)
  console.log(`Server memory${INSTANCES === 2 ? ' (first instance)' : ''}: RSS ${before.rssMb.toFixed(0)} MB before the bursts, ${after.rssMb.toFixed(0)} MB after; peak (VmHWM) ${after.hwmMb.toFixed(0)} MB over the whole run (${before.hwmMb.toFixed(0)} MB before the bursts).`)
  if (stored !== STUDENTS || submit.ok !== STUDENTS) process.exitCode = 1
}
finally {
  for (const s of servers.reverse()) await s.stop()
  rmSync(dir, { recursive: true, force: true })
}
