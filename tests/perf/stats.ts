// Timing helpers for the benchmarks: run work in batches and report the median
// time per operation over the batches (robust to the odd GC pause).
import { performance } from 'node:perf_hooks'

export interface OpStats { name: string, ops: number, medianMicros: number, opsPerSecond: number }

export const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b)
  const m = Math.floor(s.length / 2)
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2
}

/** Run `op(i)` for i in [0, total) in batches of `batch`; median µs per op over the batches. */
export function timeOps(name: string, total: number, batch: number, op: (i: number) => unknown): OpStats {
  const perOp: number[] = []
  let sink = 0
  for (let start = 0; start < total; start += batch) {
    const end = Math.min(total, start + batch)
    const t0 = performance.now()
    for (let i = start; i < end; i++) sink += op(i) ? 1 : 0
    perOp.push(((performance.now() - t0) * 1000) / (end - start))
  }
  if (sink < 0) console.log(sink) // keep the work observable
  const medianMicros = median(perOp)
  return { name, ops: total, medianMicros, opsPerSecond: 1e6 / medianMicros }
}

export const fmt = (n: number, digits = 1): string => n.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits })
