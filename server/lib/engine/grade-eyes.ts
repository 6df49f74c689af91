// Per-eye judging (domain.md §5.2, signed findings): which recorded entry belongs to
// which eye, then amount and direction of each eye against its signed finding. The
// tolerance is for the amount only; a torsion of 1° or more has a direction.

import type { EyeRecord } from '#shared/engine/parser'
import { hasDirection } from '#shared/engine/marking'
import type { Slip } from '#shared/engine/slips'
import type { Eye, PerEye } from '#shared/engine/types'
import { EYES, otherEye } from '#shared/engine/types'
import { degWords, findingWords, hasWords, wroteWords } from './grade-words'

import { DIAL_FIGURE_FROM } from '#shared/engine/record/word-tables'

const band = (err: number, tol: number): number => (err <= tol ? 1 : err <= 2 * tol ? 0.5 : 0)
const isDialFigure = (a: number): boolean => a >= DIAL_FIGURE_FROM && a <= 180

/** The size of torsion an entry claims, reading a dial figure as the change from 90° it stands for. */
function claimedSize(r: EyeRecord | undefined): number | null {
  if (!r) return null
  if (r.direction === 'none') return 0
  if (r.amount === null) return null
  return isDialFigure(r.amount) ? Math.abs(r.amount - 90) : r.amount
}

/** Does the entry, read as written, fail this eye's finding? (nothing, no torsion or the wrong size) */
function failsEye(r: EyeRecord | undefined, t: number, tol: number): boolean {
  const size = claimedSize(r)
  if (hasDirection(t)) return size === null ? r?.direction == null || r.direction === 'none' : size === 0 || Math.abs(size - Math.abs(t)) > tol
  return size !== null && size > tol
}

/** How far an entry is from an eye's finding in size, for deciding which eye it was meant for. */
function sizeMisfit(r: EyeRecord | undefined, t: number): number {
  const size = claimedSize(r)
  return size === null ? Math.abs(t) : Math.abs(size - Math.abs(t))
}

/**
 * The findings were written against the other eye when reading them the other way round
 * explains the record clearly better by size, and as written they fail an eye — whatever
 * the amounts and the tolerance. Directions are judged afterwards, against the eye each
 * entry is found to describe.
 */
export function eyesSwapped(rec: Partial<PerEye<EyeRecord>>, t: PerEye<number>, tol: number, alsoRight: Partial<PerEye<number[]>> = {}): boolean {
  if (!EYES.some(e => hasDirection(t[e]))) return false
  // as written, an entry may also be right by the learner's own reading (error carried forward)
  const asWritten = (e: Eye) => [t[e], ...(alsoRight[e] ?? [])]
  const direct = EYES.reduce((a, e) => a + Math.min(...asWritten(e).map(x => sizeMisfit(rec[e], x))), 0)
  const swapped = EYES.reduce((a, e) => a + sizeMisfit(rec[otherEye(e)], t[e]), 0)
  if (!(swapped + 0.5 < direct)) return false
  if (!EYES.some(e => asWritten(e).every(x => failsEye(rec[e], x, tol)))) return false
  // every eye with torsion must find torsion claimed in the entry read against it
  return EYES.every((e) => {
    if (!hasDirection(t[e])) return true
    const size = claimedSize(rec[otherEye(e)])
    const r = rec[otherEye(e)]
    return (size !== null && size > 0) || (r?.direction === 'excyclo' || r?.direction === 'incyclo')
  })
}

export interface EyeVerdict {
  amount: number
  direction: number
  slips: Slip[]
  amountReason: string
  directionReason: string
}

/**
 * Judge one entry against one eye's signed finding `t`. `label` is how the record named
 * the entry (RE, LE, Total…), quoted in the reasons.
 */
export function judgeEye(r: EyeRecord, t: number, eye: Eye, tol: number, label: string = eye): EyeVerdict {
  const slips: Slip[] = []
  const wrote = wroteWords(label, r)
  const truth = label === 'Total' ? `the total is ${findingWords(t)}` : hasWords(eye, t)
  const torted = hasDirection(t)
  const a = r.direction === 'none' ? 0 : r.amount

  // amount: the size only, within the tolerance
  let amount: number
  let amountReason: string
  let sizeOff = false
  if (a === null) {
    amount = 0
    amountReason = `${wrote}: no amount in degrees.`
    slips.push({ code: 'amount-missing', eye })
  }
  else if (isDialFigure(a)) {
    amount = 0
    amountReason = `${wrote}: ${a}° is a figure off the dial; the amount is the change from 90° (${degWords(a - 90)}).`
    slips.push({ code: 'dial-value-as-amount', eye, detail: `wrote ${a}°; ${Math.abs(a - 90)}° from 90° is the amount` })
  }
  else {
    // an eye under 1° is right with any amount within the tolerance of zero
    const err = torted ? Math.abs(a - Math.abs(t)) : Math.min(a, Math.abs(a - Math.abs(t)))
    amount = band(err, tol)
    sizeOff = err > tol
    amountReason = amount === 1
      ? `${wrote}; ${truth}: within the ${degWords(tol)} tolerance.`
      : `${wrote}; ${truth}: ${degWords(err)} out${amount === 0.5 ? ' (partial credit within twice the tolerance)' : ''}.`
    if (sizeOff) slips.push({ code: 'amount-off', eye, detail: `${a}° recorded, ${findingWords(t)} found` })
  }

  // direction: judged on the signed finding, never excused by the tolerance
  let direction: number
  let directionReason: string
  if (!torted) {
    const size = a === null ? null : isDialFigure(a) ? Math.abs(a - 90) : a
    if (r.direction === 'none' || (size !== null && size <= tol)) {
      direction = 1
      directionReason = `${wrote}; ${truth}: right for an eye under 1°.`
    }
    else {
      direction = 0
      directionReason = `${wrote}; ${truth}, so it has no direction to record.`
    }
  }
  else if (r.direction === 'none' || a === 0) {
    direction = 0
    directionReason = `${wrote}; ${truth}.`
    if (!sizeOff) slips.push({ code: 'direction-missing', eye })
  }
  else if (r.direction === null) {
    direction = 0
    directionReason = `${wrote}: no direction; ${truth}.`
    slips.push({ code: 'direction-missing', eye })
  }
  else if ((r.direction === 'excyclo') === (t > 0)) {
    direction = 1
    directionReason = `${wrote}; ${truth}: the direction is right.`
  }
  else {
    direction = 0
    directionReason = `${wrote}; ${truth}: the direction is reversed.`
    slips.push({ code: 'direction-reversed', eye })
  }
  return { amount, direction, slips, amountReason, directionReason }
}

/** The eye an entry written without an eye most likely describes: the one it fits best by size. */
export function likeliestEye(r: EyeRecord, t: PerEye<number>): Eye {
  const fit = (e: Eye) => sizeMisfit(r, t[e])
  return fit('LE') < fit('RE') ? 'LE' : 'RE'
}
