// Bands of the signed amount error (recorded amount − true magnitude, degrees),
// shared by the SQL that counts them and the page that labels them. The middle
// band is the default grading tolerance (2°, docs/engine.md); 30° or more over
// can only be a figure copied off the dial, since no template draws torsion near 30°.
import type { AmountBand } from '#shared/schemas/review'

export interface BandEdge { band: AmountBand, label: string, min: number | null, max: number | null, minInclusive: boolean, maxInclusive: boolean }

export const AMOUNT_BAND_EDGES: readonly BandEdge[] = [
  { band: 'under-5', label: 'more than 5° under', min: null, max: -5, minInclusive: false, maxInclusive: false },
  { band: 'minus-5-2', label: '2–5° under', min: -5, max: -2, minInclusive: true, maxInclusive: false },
  { band: 'within-2', label: 'within 2°', min: -2, max: 2, minInclusive: true, maxInclusive: true },
  { band: 'plus-2-5', label: '2–5° over', min: 2, max: 5, minInclusive: false, maxInclusive: true },
  { band: 'plus-5-30', label: '5–30° over', min: 5, max: 30, minInclusive: false, maxInclusive: false },
  { band: 'dial-figure', label: '30° or more over (a dial figure)', min: 30, max: null, minInclusive: true, maxInclusive: false },
]

export function bandOf(error: number): AmountBand {
  for (const b of AMOUNT_BAND_EDGES) {
    const aboveMin = b.min === null || (b.minInclusive ? error >= b.min : error > b.min)
    const belowMax = b.max === null || (b.maxInclusive ? error <= b.max : error < b.max)
    if (aboveMin && belowMax) return b.band
  }
  return 'dial-figure'
}

/** Monday of the ISO week that holds this day (YYYY-MM-DD). */
export function weekOf(day: string): string {
  const d = new Date(`${day.slice(0, 10)}T00:00:00Z`)
  const back = (d.getUTCDay() + 6) % 7
  return new Date(d.getTime() - back * 86_400_000).toISOString().slice(0, 10)
}
