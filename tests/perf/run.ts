// npm run perf — the engine in-process, then grading over HTTP against the built
// server beside an anonymous and a signed-in trivial route. Prints medians and
// the ratios (with issue 12's targets); never part of npm test.
// The HTTP part runs on SQLite and, when CYCLODIAL_TEST_PG_URL is set or a cluster
// of scripts/pg-cluster.sh is running, again on a fresh PostgreSQL database, one
// after the other; both are printed side by side in one table (issue 15).
import { cpus, loadavg } from 'node:os'
import { engineBench } from './engine'
import { httpBench } from './http'
import type { HttpStats } from './http'
import { benchPgUrl } from './pg-target'
import { fmt } from './stats'

const count = Number(process.env.BENCH_COUNT ?? 100_000)
const seconds = Number(process.env.BENCH_SECONDS ?? 8)
const load = () => loadavg().map(x => x.toFixed(2)).join(' ')

console.log(`Cyclodial benchmark — Node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}; load average at start ${load()}`)
console.log(`\nIn-process, ${count.toLocaleString('en-GB')} operations each (median over batches of 1,000):`)
for (const s of engineBench(count)) {
  console.log(`  ${s.name.padEnd(52)} ${fmt(s.medianMicros).padStart(8)} µs/op  ${fmt(s.opsPerSecond, 0).padStart(9)} op/s`)
}

const pgUrl = await benchPgUrl()
const runs: { name: string, r: { health: HttpStats, me: HttpStats, check: HttpStats } }[] = []
runs.push({ name: 'SQLite', r: await httpBench(seconds) })
if (pgUrl) runs.push({ name: 'PostgreSQL', r: await httpBench(seconds, 20, pgUrl) })

console.log(`\nOver HTTP against the built server (autocannon, 20 connections, ${seconds} s per route, loopback; one database after the other):`)
if (!pgUrl) console.log('  PostgreSQL: not measured (set CYCLODIAL_TEST_PG_URL, or start a cluster: eval "$(bash scripts/pg-cluster.sh start)")')
console.log(`  ${'route'.padEnd(26)} ${runs.map(x => `${x.name.padStart(12)} req/s  median`).join('   ')}`)
for (const key of ['health', 'me', 'check'] as const) {
  const cells = runs.map(x => `${fmt(x.r[key].requestsPerSecond, 0).padStart(18)}  ${`${fmt(x.r[key].medianLatencyMs, 0)} ms`.padStart(6)}`)
  console.log(`  ${runs[0]!.r[key].route.padEnd(26)} ${cells.join('   ')}`)
}
// Issue 12, point 3: signed-in requests must stay cheap (the unsealed session
// cookie is cached; revocation is one indexed read). Targets, side by side in one run:
const TARGETS = { me: 0.7, check: 0.5 }
const ratios = runs.map(({ r }) => ({
  me: r.me.requestsPerSecond / r.health.requestsPerSecond,
  check: r.check.requestsPerSecond / r.health.requestsPerSecond,
  inverse: r.health.requestsPerSecond / r.check.requestsPerSecond,
}))
const cell = (x: number, target?: number) => `${fmt(x, 2)}×${target === undefined ? '' : ` (${x >= target ? 'met' : 'NOT met'})`}`.padStart(18)
console.log(`  ${'ratio'.padEnd(52)} ${runs.map(x => x.name.padStart(18)).join(' ')}`)
console.log(`  ${`signed-in trivial ÷ anonymous trivial (target ≥ ${TARGETS.me}×)`.padEnd(52)} ${ratios.map(x => cell(x.me, TARGETS.me)).join(' ')}`)
console.log(`  ${`record check ÷ anonymous trivial (target ≥ ${TARGETS.check}×)`.padEnd(52)} ${ratios.map(x => cell(x.check, TARGETS.check)).join(' ')}`)
console.log(`  ${'anonymous trivial ÷ record check'.padEnd(52)} ${ratios.map(x => cell(x.inverse)).join(' ')}`)
for (const { name, r } of runs) {
  const failed = [r.health, r.me, r.check].filter(s => s.errors + s.non2xx > 0)
  for (const s of failed) console.error(`${name}: ${s.route}: errors ${s.errors}, non-2xx ${s.non2xx}`)
  if (failed.length) {
    console.error('Some requests failed: the figures above are not trustworthy.')
    process.exitCode = 1
  }
}
console.log(`\nload average at end ${load()}`)
