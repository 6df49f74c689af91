// Tutors' case templates narrow an engine template's ranges. The engine itself is
// never changed: a narrowed template draws cases with the engine's own template and
// keeps only those whose numbers fall inside the narrower ranges (rejection over a
// deterministic run of seeds). A stored case therefore regenerates from its engine
// template id and seed alone, exactly like a practice case.
import { createError } from 'h3'
import type { NarrowedRanges } from '#shared/schemas/casebook'
import { generateCase } from '~~/server/lib/engine/generator'
import type { CaseTemplate, NumberRange } from '~~/server/lib/engine/templates'
import { getCaseTemplate } from '~~/server/lib/engine/templates'
import type { Case } from '~~/server/lib/engine/types'

/** How many candidate seeds a derivation may try before giving up. */
export const NARROW_MAX_TRIES = 3000
/** Seeds sampled to check that a narrowed template can still make cases. */
export const NARROW_FEASIBILITY_SAMPLES = 400
/** Share of the engine's cases a narrowed template must keep (1 in 100). */
export const NARROW_MIN_SHARE = 0.01

/** The primary-position torsion values the template's torsion range speaks of. */
export function torsionMeasures(c: Case, torsionOf: CaseTemplate['ranges']['torsionOf']): number[] {
  const t = c.gazes.primary.torsion
  switch (torsionOf) {
    case 'affected-eye':
    case 'objective-affected-eye':
      return [Math.abs(t[c.affectedEye ?? 'RE'])]
    case 'total':
      return [t.RE + t.LE]
    case 'hyper-and-hypo-eye':
      return [Math.abs(t.RE), Math.abs(t.LE)]
    case 'each-eye':
      return [t.RE, t.LE]
  }
}

const inside = (v: number, r: readonly [number, number]) => v >= r[0] - 1e-9 && v <= r[1] + 1e-9

export function caseWithin(c: Case, t: CaseTemplate, ranges: NarrowedRanges): boolean {
  if (ranges.torsion && !torsionMeasures(c, t.ranges.torsionOf).every(v => inside(v, ranges.torsion!))) return false
  if (ranges.vertical && !inside(Math.abs(c.gazes.primary.vertical), ranges.vertical)) return false
  return true
}

export interface RangeProblem { path: string, message: string }

const fmt = (r: NumberRange) => `${r[0]}–${r[1]}`

/**
 * Problems with a narrowed range: it must sit inside the published range, and
 * enough of the engine's cases must fall inside it for the quiz to draw from.
 */
export function narrowingProblems(templateId: string, ranges: NarrowedRanges, path = 'ranges'): RangeProblem[] {
  const t = getCaseTemplate(templateId)
  if (!t) return [{ path: 'templateId', message: `There is no case template "${templateId}".` }]
  const problems: RangeProblem[] = []
  const within = (key: 'torsion' | 'vertical', unit: string) => {
    const r = ranges[key]
    if (!r) return
    const pub = t.ranges[key]
    if (r[0] < pub[0] || r[1] > pub[1]) {
      problems.push({ path: `${path}.${key}`, message: `Stay inside the published range for this template: ${fmt(pub)}${unit}.` })
    }
  }
  within('torsion', '°')
  within('vertical', ' Δ')
  if (problems.length) return problems
  if (!ranges.torsion && !ranges.vertical) return []
  let hits = 0
  for (let i = 0; i < NARROW_FEASIBILITY_SAMPLES; i++) {
    if (caseWithin(generateCase(t, `feasibility-${i}`), t, ranges)) hits++
  }
  if (hits < NARROW_FEASIBILITY_SAMPLES * NARROW_MIN_SHARE) {
    const key = ranges.torsion ? 'torsion' : 'vertical'
    problems.push({
      path: `${path}.${key}`,
      message: `Too narrow: only ${hits} of ${NARROW_FEASIBILITY_SAMPLES} patients this template makes fall inside these ranges. Widen them so at least 1 in 100 does.`,
    })
  }
  return problems
}

/**
 * The case for `baseSeed` under a narrowed template: the first of `baseSeed`,
 * `baseSeed.1`, `baseSeed.2`, … whose case falls inside the ranges. Deterministic,
 * so the same quiz, item and student always give the same patient.
 */
export function narrowedCase(templateId: string, ranges: NarrowedRanges, baseSeed: string): { case: Case, seed: string } {
  const t = getCaseTemplate(templateId)
  if (!t) throw new Error(`Unknown case template "${templateId}".`)
  for (let k = 0; k < NARROW_MAX_TRIES; k++) {
    const seed = k === 0 ? baseSeed : `${baseSeed}.${k}`
    const c = generateCase(t, seed)
    if (caseWithin(c, t, ranges)) return { case: c, seed }
  }
  throw createError({
    statusCode: 409,
    statusMessage: 'Conflict',
    message: 'No patient could be drawn inside this template\'s ranges. Ask your tutor to widen them.',
    data: { code: 'ranges-too-narrow' },
  })
}
