// Issue 11, property tests: a correct, complete record built from a random signed truth
// scores full marks with no slips; one slip transform applied to it is marked with
// exactly that slip (and eye), and a critical slip caps the score at 50 %.
// Rules: domain.md §3.3 (positive = excyclo), §3.4 (reading rules), §5.1–§5.3.

import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { gradeRecord } from '~~/server/lib/engine/grader'
import type { GradeResult } from '~~/server/lib/engine/grader'
import { EYES, otherEye } from '#shared/engine/types'
import type { Eye, PerEye } from '#shared/engine/types'

const SEED = 20261102 // fixed for reproducibility
const RUNS = 50 // per property; seven properties keep the whole file to a few hundred runs

/** An eye "has torsion" from 1° (domain.md §5.2 signed findings, common practice). */
const TORTED = 1

// A signed truth per eye: either under 1° (no torsion worth a direction) or 1°–20° either way.
const arbSmall = fc.double({ min: -0.95, max: 0.95, noNaN: true })
const arbBig = fc.tuple(fc.double({ min: 1, max: 20, noNaN: true }), fc.boolean()).map(([a, neg]) => (neg ? -a : a))
const arbTorsion = fc.oneof(arbSmall, arbBig)
const arbTruth = fc.record({ RE: arbTorsion, LE: arbTorsion })
const arbTolerance = fc.integer({ min: 1, max: 5 })

// One finding per eye, as written in a record.
interface Entry {
  eye: Eye
  amount: number | null
  /** 'ex' | 'in' | 'none' (no torsion) | null (direction left out) */
  dir: 'ex' | 'in' | 'none' | null
}

interface Built {
  test: boolean
  gaze: boolean
  entries: [Entry, Entry]
  style: number
}

const EX_WORD = ['excyclotorsion', 'ex', 'excyclo']
const IN_WORD = ['incyclotorsion', 'in', 'incyclo']
const NONE_WORD = ['no torsion', 'nil', 'no torsion']
const EYE_WORD: Record<Eye, string[]> = { RE: ['RE', 'RE', 'right eye'], LE: ['LE', 'LE', 'left eye'] }

function entryText(e: Entry, style: number): string {
  const eye = EYE_WORD[e.eye][style]!
  if (e.dir === 'none') return `${eye} ${NONE_WORD[style]}`
  const amount = e.amount === null ? '' : style === 2 ? ` ${e.amount} degrees` : ` ${e.amount}°`
  const dir = e.dir === null ? '' : ` ${(e.dir === 'ex' ? EX_WORD : IN_WORD)[style]}`
  return `${eye}${amount}${dir}`
}

/** Three common ways of writing the same complete record (domain.md §5.1, clinical-facts §9). */
function write(b: Built): string {
  const [a, c] = b.entries
  const findings = `${entryText(a, b.style)}, ${entryText(c, b.style)}`
  if (b.style === 0) return `${[...(b.test ? ['DMR'] : []), 'near', ...(b.gaze ? ['primary position'] : [])].join(', ')}: ${findings}.`
  if (b.style === 1) return `${[...(b.test ? ['DMR'] : []), 'N', ...(b.gaze ? ['PP'] : [])].join(' ')}: ${findings}`
  return `${[...(b.test ? ['Double Maddox rod'] : []), 'at 33 cm', ...(b.gaze ? ['primary'] : [])].join(', ')}: ${findings.replace(', ', '; ')}`
}

function correctEntry(eye: Eye, t: number): Entry {
  if (Math.abs(t) < TORTED) return { eye, amount: null, dir: 'none' }
  return { eye, amount: Math.round(Math.abs(t)), dir: t > 0 ? 'ex' : 'in' }
}

function correct(truth: PerEye<number>, style: number): Built {
  return { test: true, gaze: true, entries: [correctEntry('RE', truth.RE), correctEntry('LE', truth.LE)], style }
}

function grade(record: string, truth: PerEye<number>, tolerance: number): GradeResult {
  return gradeRecord({ record, expected: truth, gaze: 'primary', distance: 'near', options: { tolerance } })
}

const slipKeys = (r: GradeResult): string[] => r.slips.map(s => (s.eye ? `${s.code}:${s.eye}` : s.code)).sort()
const torted = (truth: PerEye<number>): Eye[] => EYES.filter(e => Math.abs(truth[e]) >= TORTED)
const arbStyle = fc.integer({ min: 0, max: 2 })
const opts = { seed: SEED, numRuns: RUNS }

/** Replace one eye's entry. */
function withEntry(b: Built, eye: Eye, f: (e: Entry) => Entry): Built {
  return { ...b, entries: b.entries.map(e => (e.eye === eye ? f(e) : e)) as [Entry, Entry] }
}

describe('marking properties (issue 11)', () => {
  it('a correct complete record built from the truth scores 1 with no slips', () => {
    fc.assert(
      fc.property(arbTruth, arbTolerance, arbStyle, (truth, tol, style) => {
        const record = write(correct(truth, style))
        const r = grade(record, truth, tol)
        expect(slipKeys(r), `${record} → ${r.readAs}`).toEqual([])
        expect(r.score).toBe(1)
      }),
      opts,
    )
  })

  it('swapping the eye labels → exactly eye-wrong on the torted eye, score ≤ 0.5', () => {
    // only where one eye has torsion ≥ 1°, the other under 1°, and they differ by more than the tolerance
    const arb = fc
      .tuple(fc.constantFrom<Eye>('RE', 'LE'), arbBig, arbSmall, arbTolerance, arbStyle)
      .filter(([, big, small, tol]) => Math.abs(Math.abs(big) - Math.abs(small)) > tol + 0.5)
    fc.assert(
      fc.property(arb, ([eye, big, small, tol, style]) => {
        const truth: PerEye<number> = eye === 'RE' ? { RE: big, LE: small } : { RE: small, LE: big }
        const b = correct(truth, style)
        const swapped: Built = { ...b, entries: b.entries.map(e => ({ ...e, eye: otherEye(e.eye) })) as [Entry, Entry] }
        const record = write(swapped)
        const r = grade(record, truth, tol)
        expect(slipKeys(r), `${record} → ${r.readAs}`).toEqual([`eye-wrong:${eye}`]) // domain.md §5.2 signed findings (common practice)
        expect(r.score).toBeLessThanOrEqual(0.5) // domain.md §5.2 critical slips
      }),
      opts,
    )
  })

  it('reversing the sign of an eye with torsion ≥ 1° → exactly direction-reversed on that eye, score ≤ 0.5, whatever the tolerance', () => {
    const arb = fc.tuple(arbTruth, arbTolerance, arbStyle, fc.nat()).filter(([truth]) => torted(truth).length > 0)
    fc.assert(
      fc.property(arb, ([truth, tol, style, pick]) => {
        const eyes = torted(truth)
        const eye = eyes[pick % eyes.length]!
        const b = withEntry(correct(truth, style), eye, e => ({ ...e, dir: e.dir === 'ex' ? 'in' : 'ex' }))
        const record = write(b)
        const r = grade(record, truth, tol)
        expect(slipKeys(r), `${record} → ${r.readAs}`).toEqual([`direction-reversed:${eye}`]) // domain.md §5.2 signed findings (common practice)
        expect(r.score).toBeLessThanOrEqual(0.5) // domain.md §5.2 critical slips
      }),
      opts,
    )
  })

  it('writing the dial figure (RE 90 + t, LE 90 − t) as the amount → exactly dial-value-as-amount on that eye, score ≤ 0.5', () => {
    const arb = fc.tuple(arbTruth, arbTolerance, arbStyle, fc.nat()).filter(([truth]) => torted(truth).length > 0)
    fc.assert(
      fc.property(arb, ([truth, tol, style, pick]) => {
        const eyes = torted(truth)
        const eye = eyes[pick % eyes.length]!
        // ISO 8429:1986 dial, domain.md §3.4: RE t = a − 90 → a = 90 + t; LE t = 90 − a → a = 90 − t
        const dial = Math.round(eye === 'RE' ? 90 + truth[eye] : 90 - truth[eye])
        const b = withEntry(correct(truth, style), eye, e => ({ ...e, amount: dial }))
        const record = write(b)
        const r = grade(record, truth, tol)
        expect(slipKeys(r), `${record} → ${r.readAs}`).toEqual([`dial-value-as-amount:${eye}`]) // domain.md §5.3
        expect(r.score).toBeLessThanOrEqual(0.5) // domain.md §5.2 critical slips
      }),
      opts,
    )
  })

  it('dropping the test name → exactly test-unnamed, score below 1 and above 0.5', () => {
    fc.assert(
      fc.property(arbTruth, arbTolerance, arbStyle, (truth, tol, style) => {
        const record = write({ ...correct(truth, style), test: false })
        const r = grade(record, truth, tol)
        expect(slipKeys(r), `${record} → ${r.readAs}`).toEqual(['test-unnamed']) // domain.md §5.1 complete record
        expect(r.score).toBeLessThan(1)
        expect(r.score).toBeGreaterThan(0.5)
      }),
      opts,
    )
  })

  it('dropping the position of gaze → exactly gaze-missing, score below 1 and above 0.5', () => {
    fc.assert(
      fc.property(arbTruth, arbTolerance, arbStyle, (truth, tol, style) => {
        const record = write({ ...correct(truth, style), gaze: false })
        const r = grade(record, truth, tol)
        expect(slipKeys(r), `${record} → ${r.readAs}`).toEqual(['gaze-missing']) // domain.md §5.1 complete record
        expect(r.score).toBeLessThan(1)
        expect(r.score).toBeGreaterThan(0.5)
      }),
      opts,
    )
  })

  it('dropping the direction of an eye with torsion ≥ 1° → exactly direction-missing on that eye, score below 1', () => {
    const arb = fc.tuple(arbTruth, arbTolerance, arbStyle, fc.nat()).filter(([truth]) => torted(truth).length > 0)
    fc.assert(
      fc.property(arb, ([truth, tol, style, pick]) => {
        const eyes = torted(truth)
        const eye = eyes[pick % eyes.length]!
        const b = withEntry(correct(truth, style), eye, e => ({ ...e, dir: null }))
        const record = write(b)
        const r = grade(record, truth, tol)
        expect(slipKeys(r), `${record} → ${r.readAs}`).toEqual([`direction-missing:${eye}`]) // domain.md §5.1 complete record
        expect(r.score).toBeLessThan(1)
      }),
      opts,
    )
  })
})
