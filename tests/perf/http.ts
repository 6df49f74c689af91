// Grading through HTTP: POST /api/record-check against the BUILT server, compared
// in the same run with a trivial JSON route of the same server (GET /api/health,
// one indexed SELECT, anonymous). A signed-in trivial route (GET /api/auth/me:
// session cookie looked up in the unsealed-cookie cache, session and user read in
// one indexed read) shows what signing in costs. Loopback only; every run is
// bounded in time.
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import autocannon from 'autocannon'
import { createTestDatabase } from '../support/pg'
import type { TestDatabase } from '../support/pg'
import { startServer } from '../support/server'

export interface HttpStats { route: string, requestsPerSecond: number, medianLatencyMs: number, errors: number, non2xx: number }

interface RunOptions { url: string, method?: 'GET' | 'POST', body?: string, headers?: Record<string, string>, seconds: number, connections: number }

function run(o: RunOptions): Promise<autocannon.Result> {
  return new Promise((resolve, reject) => {
    const instance = autocannon({
      url: o.url,
      method: o.method ?? 'GET',
      body: o.body,
      headers: o.headers,
      connections: o.connections,
      duration: o.seconds,
      timeout: 10,
    }, (err, result) => (err ? reject(err) : resolve(result)))
    // a hard stop in case the server stops answering
    setTimeout(() => instance.stop(), (o.seconds + 15) * 1000).unref()
  })
}

const stats = (route: string, r: autocannon.Result): HttpStats => ({
  route,
  requestsPerSecond: r.requests.average,
  medianLatencyMs: r.latency.p50,
  errors: r.errors + r.timeouts,
  non2xx: r.non2xx,
})

/**
 * `pgAdminUrl` given: the server runs on a fresh PostgreSQL database of that cluster
 * (dropped afterwards); otherwise on a fresh SQLite file, even when CYCLODIAL_TEST_PG_URL is set.
 */
export async function httpBench(seconds = 8, connections = 20, pgAdminUrl?: string): Promise<{ health: HttpStats, me: HttpStats, check: HttpStats, rounds: number }> {
  const dir = mkdtempSync(join(tmpdir(), 'cyclodial-bench-http-'))
  let database: TestDatabase | undefined
  if (pgAdminUrl) database = await createTestDatabase(pgAdminUrl)
  const server = await startServer({
    env: { NUXT_MAIL_CATCHER: '0' },
    ...(database ? { databaseUrl: database.url } : { dbPath: join(dir, 'cyclodial.sqlite') }),
  }).catch(async (error) => {
    await database?.drop()
    rmSync(dir, { recursive: true, force: true })
    throw error
  })
  try {
    const login = await fetch(`${server.baseURL}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'tutor@cyclodial.test', password: 'cyclodial-demo' }),
    })
    if (!login.ok) throw new Error(`sign-in failed: ${login.status}`)
    const cookie = login.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
    const checkBody = JSON.stringify({ torsion: { RE: 10, LE: 0 }, gaze: 'primary', distance: 'near', readings: { RE: 100, LE: 90 }, record: 'DMR N PP: RE 10 in, LE nil' })
    const probe = await fetch(`${server.baseURL}/api/record-check`, { method: 'POST', headers: { cookie, 'content-type': 'application/json', 'origin': server.baseURL }, body: checkBody })
    if (!probe.ok) throw new Error(`record-check probe failed: ${probe.status}`)

    // warm both routes, then measure them alternately so drift hits both alike
    await run({ url: `${server.baseURL}/api/health`, seconds: 2, connections })
    await run({ url: `${server.baseURL}/api/auth/me`, headers: { cookie }, seconds: 2, connections })
    await run({ url: `${server.baseURL}/api/record-check`, method: 'POST', body: checkBody, headers: { cookie, 'content-type': 'application/json', 'origin': server.baseURL }, seconds: 2, connections })
    const healthRuns: autocannon.Result[] = []
    const meRuns: autocannon.Result[] = []
    const checkRuns: autocannon.Result[] = []
    const rounds = 2
    for (let i = 0; i < rounds; i++) {
      healthRuns.push(await run({ url: `${server.baseURL}/api/health`, seconds: seconds / rounds, connections }))
      meRuns.push(await run({ url: `${server.baseURL}/api/auth/me`, headers: { cookie }, seconds: seconds / rounds, connections }))
      checkRuns.push(await run({ url: `${server.baseURL}/api/record-check`, method: 'POST', body: checkBody, headers: { cookie, 'content-type': 'application/json', 'origin': server.baseURL }, seconds: seconds / rounds, connections }))
    }
    const merge = (route: string, rs: autocannon.Result[]): HttpStats => {
      const all = rs.map(r => stats(route, r))
      return {
        route,
        requestsPerSecond: all.reduce((a, s) => a + s.requestsPerSecond, 0) / all.length,
        medianLatencyMs: all.map(s => s.medianLatencyMs).sort((a, b) => a - b)[Math.floor(all.length / 2)]!,
        errors: all.reduce((a, s) => a + s.errors, 0),
        non2xx: all.reduce((a, s) => a + s.non2xx, 0),
      }
    }
    return { health: merge('GET /api/health', healthRuns), me: merge('GET /api/auth/me', meRuns), check: merge('POST /api/record-check', checkRuns), rounds }
  }
  finally {
    await server.stop()
    await database?.drop()
    rmSync(dir, { recursive: true, force: true })
  }
}
