// npm run perf — the engine in-process, then grading over HTTP against the built
// server beside an anonymous and a signed-in trivial route. Prints medians and
// the ratios (with issue 12's targets); never part of npm test.
import { cpus } from 'node:os'
import { engineBench } from './engine'
import { httpBench } from './http'
import { fmt } from './stats'

const count = Number(process.env.BENCH_COUNT ?? 100_000)
const seconds = Number(process.env.BENCH_SECONDS ?? 8)

console.log(`Cyclodial benchmark — Node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}`)
console.log(`\nIn-process, ${count.toLocaleString('en-GB')} operations each (median over batches of 1,000):`)
for (const s of engineBench(count)) {
  console.log(`  ${s.name.padEnd(52)} ${fmt(s.medianMicros).padStart(8)} µs/op  ${fmt(s.opsPerSecond, 0).padStart(9)} op/s`)
}

console.log(`\nOver HTTP against the built server (autocannon, 20 connections, ${seconds} s per route, loopback):`)
const { health, me, check } = await httpBench(seconds)
for (const s of [health, me, check]) {
  console.log(`  ${s.route.padEnd(26)} ${fmt(s.requestsPerSecond, 0).padStart(8)} req/s   median ${fmt(s.medianLatencyMs, 0)} ms   errors ${s.errors}, non-2xx ${s.non2xx}`)
}
// Issue 12, point 3: signed-in requests must stay cheap (the unsealed session
// cookie is cached; revocation is one indexed read). Targets, side by side in one run:
const TARGETS = { me: 0.7, check: 0.5 }
const meRatio = me.requestsPerSecond / health.requestsPerSecond
const checkRatio = check.requestsPerSecond / health.requestsPerSecond
console.log(`  ratio signed-in trivial route ÷ anonymous trivial route: ${fmt(meRatio, 2)}×  (target ≥ ${TARGETS.me}×: ${meRatio >= TARGETS.me ? 'met' : 'NOT met'})`)
console.log(`  ratio signed-in record check ÷ anonymous trivial route:  ${fmt(checkRatio, 2)}×  (target ≥ ${TARGETS.check}×: ${checkRatio >= TARGETS.check ? 'met' : 'NOT met'})`)
console.log(`  ratio anonymous trivial route ÷ record check: ${fmt(health.requestsPerSecond / check.requestsPerSecond, 2)}×`)
if ([health, me, check].some(s => s.errors + s.non2xx > 0)) {
  console.error('Some requests failed: the figures above are not trustworthy.')
  process.exitCode = 1
}
