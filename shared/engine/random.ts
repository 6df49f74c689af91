// Seeded randomness shared by the generator (server) and the patient's words
// (browser). seedrandom gives the same sequence on both sides for the same key.

import seedrandom from 'seedrandom'

export type Rng = () => number

export const makeRng = (key: string): Rng => seedrandom(key)

export const uniform = (rng: Rng, min: number, max: number): number => min + (max - min) * rng()

/** Normal deviate by Box–Muller; two draws per call keep the sequence easy to reason about. */
export function normal(rng: Rng, mean: number, sd: number): number {
  const u1 = Math.max(rng(), Number.EPSILON)
  const u2 = rng()
  return mean + sd * Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2)
}

export const clamp = (v: number, min: number, max: number): number => Math.min(max, Math.max(min, v))

export const pick = <T>(rng: Rng, items: readonly T[]): T => {
  if (items.length === 0) throw new Error('pick from an empty list')
  return items[Math.floor(rng() * items.length) % items.length]!
}

/** Round to one decimal place: the precision Cyclodial stores findings in. */
export const round1 = (v: number): number => Math.round(v * 10) / 10
