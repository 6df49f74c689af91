// The review page's aggregates, computed in SQL. Each query walks one covering
// index of migration 0004 and GROUPs BY cohort first, then by what it counts, in
// the index's own order, so SQLite groups as it reads and never sorts the
// filtered rows; the few hundred groups are then folded across cohorts here.
import { sql } from 'kysely'
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'
import { SLIP_CODES, SLIP_INFO, isSlipCode } from '#shared/engine/slips'
import type { SlipCode } from '#shared/engine/slips'
import { EYES } from '#shared/engine/types'
import type { Eye } from '#shared/engine/types'
import { AMOUNT_BAND_EDGES, bandOf, weekOf } from '#shared/review/bands'
import type { BandEdge } from '#shared/review/bands'
import type { ReviewFilters } from '#shared/schemas/review'
import type { AmountBandCount, DirectionTable, ReviewTotals, SlipCount, TrendWeek } from '#shared/types/review'
import { applyReviewFilters } from './filters'
import { byCohortParts } from './scope'
import type { ReviewScope } from './scope'

/** Attempts per learner in the view (gives the totals). */
export async function attemptsPerLearner(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope): Promise<Map<number, number>> {
  const rows = await byCohortParts(db, scope, part => applyReviewFilters(db.selectFrom('attempts'), 'attempts', f, part)
    .select(eb => ['attempts.cohort_id', 'attempts.learner_id', eb.fn.countAll<number>().as('n')])
    .groupBy(['attempts.cohort_id', 'attempts.learner_id']).execute())
  const out = new Map<number, number>()
  for (const r of rows) out.set(r.learner_id, (out.get(r.learner_id) ?? 0) + Number(r.n))
  return out
}

export async function reviewTotals(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope): Promise<ReviewTotals> {
  const per = await attemptsPerLearner(db, f, scope)
  let attempts = 0
  for (const n of per.values()) attempts += n
  return { attempts, learners: per.size }
}

/** Slips by code in the view (a slip in both eyes counts twice; the eye filter keeps that eye's). */
export async function slipCodeCounts(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope): Promise<Map<SlipCode, number>> {
  const rows = await byCohortParts(db, scope, part => applyReviewFilters(db.selectFrom('attempt_slips'), 'attempt_slips', f, part, { eye: true })
    .select(eb => ['attempt_slips.cohort_id', 'attempt_slips.code', 'attempt_slips.eye', eb.fn.countAll<number>().as('n')])
    .groupBy(['attempt_slips.cohort_id', 'attempt_slips.code', 'attempt_slips.eye']).execute())
  const counts = new Map<SlipCode, number>()
  for (const r of rows) if (isSlipCode(r.code)) counts.set(r.code, (counts.get(r.code) ?? 0) + Number(r.n))
  return counts
}

/** Every slip code with its count and its rate per 100 attempts, most frequent first. */
export function slipTable(counts: Map<SlipCode, number>, attempts: number): SlipCount[] {
  return SLIP_CODES
    .map((code) => {
      const count = counts.get(code) ?? 0
      return { code, title: SLIP_INFO[code].title, count, per100: attempts ? Math.round(1000 * count / attempts) / 10 : 0 }
    })
    .sort((a, b) => b.count - a.count || SLIP_CODES.indexOf(a.code) - SLIP_CODES.indexOf(b.code))
}

const TRUE_DIRS = ['excyclo', 'incyclo'] as const

function emptyDirections(): DirectionTable {
  const row = () => ({ excyclo: 0, incyclo: 0, none: 0, missing: 0 })
  return { RE: { excyclo: row(), incyclo: row() }, LE: { excyclo: row(), incyclo: row() } }
}

/**
 * True excyclo/incyclo × recorded direction, per eye (attempts whose eye had a
 * direction to record), and the number of attempts in the view (every group).
 */
export async function directionTable(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope): Promise<DirectionTable & { attempts: number }> {
  const rows = await byCohortParts(db, scope, part => applyReviewFilters(db.selectFrom('attempts'), 'attempts', f, part)
    .select(eb => ['attempts.cohort_id', 'attempts.re_true_direction', 'attempts.re_recorded_direction', 'attempts.le_true_direction', 'attempts.le_recorded_direction', eb.fn.countAll<number>().as('n')])
    .groupBy(['attempts.cohort_id', 'attempts.re_true_direction', 'attempts.re_recorded_direction', 'attempts.le_true_direction', 'attempts.le_recorded_direction'])
    .execute())
  const table = emptyDirections()
  const eyes = f.eye ? [f.eye] : EYES
  let attempts = 0
  for (const r of rows) {
    attempts += Number(r.n)
    for (const eye of eyes) {
      const t = eye === 'RE' ? r.re_true_direction : r.le_true_direction
      const rec = eye === 'RE' ? r.re_recorded_direction : r.le_recorded_direction
      if (!(TRUE_DIRS as readonly (string | null)[]).includes(t)) continue
      const cell = rec === null ? 'missing' : rec === 'excyclo' || rec === 'incyclo' || rec === 'none' ? rec : null
      if (cell) table[eye][t as 'excyclo' | 'incyclo'][cell] += Number(r.n)
    }
  }
  return { ...table, attempts }
}

/** The SQL condition for one amount band on one eye's signed error (drill-down). */
export function bandCondition(eye: Eye, b: BandEdge) {
  const e = sql.ref(`attempts.${eye.toLowerCase()}_amount_error`)
  const parts = [sql`${e} is not null`]
  if (b.min !== null) parts.push(b.minInclusive ? sql`${e} >= ${b.min}` : sql`${e} > ${b.min}`)
  if (b.max !== null) parts.push(b.maxInclusive ? sql`${e} <= ${b.max}` : sql`${e} < ${b.max}`)
  return sql<boolean>`(${sql.join(parts, sql` and `)})`
}

export async function amountBands(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope): Promise<{ bands: AmountBandCount[], recorded: Record<Eye, number> }> {
  const counts: Record<Eye, Map<string, number>> = { RE: new Map(), LE: new Map() }
  const recorded: Record<Eye, number> = { RE: 0, LE: 0 }
  const eyes = f.eye ? [f.eye] : EYES
  // one query per eye, sent together: on PostgreSQL each runs on its own pooled connection
  const perEye = await Promise.all(eyes.map((eye) => {
    const col = eye === 'RE' ? 'attempts.re_amount_error' as const : 'attempts.le_amount_error' as const
    return byCohortParts(db, scope, part => applyReviewFilters(db.selectFrom('attempts'), 'attempts', f, part)
      .select(eb => ['attempts.cohort_id', `${col} as error`, eb.fn.countAll<number>().as('n')])
      .where(col, 'is not', null)
      .groupBy(['attempts.cohort_id', col]).execute())
  }))
  eyes.forEach((eye, i) => {
    for (const r of perEye[i]!) {
      const band = bandOf(Number(r.error))
      counts[eye].set(band, (counts[eye].get(band) ?? 0) + Number(r.n))
      recorded[eye] += Number(r.n)
    }
  })
  return {
    bands: AMOUNT_BAND_EDGES.map(b => ({ band: b.band, label: b.label, RE: counts.RE.get(b.band) ?? 0, LE: counts.LE.get(b.band) ?? 0 })),
    recorded,
  }
}

/** Attempts and slips per week (Monday first). Grouped by day in SQL, folded into weeks here. */
export async function weeklyTrend(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope): Promise<TrendWeek[]> {
  // the same expression as the indexes attempts_rv_day and attempt_slips_rv_day, so they serve the GROUP BY
  const attemptDay = sql<string>`substr(${sql.ref('attempts.submitted_at')}, 1, 10)`
  const slipDay = sql<string>`substr(${sql.ref('attempt_slips.created_at')}, 1, 10)`
  // the two queries are sent together, each in parts of the cohorts (on PostgreSQL, side by side)
  const [attemptDays, slipDays] = await Promise.all([
    byCohortParts(db, scope, part => applyReviewFilters(db.selectFrom('attempts'), 'attempts', f, part)
      .select(eb => ['attempts.cohort_id', attemptDay.as('day'), eb.fn.countAll<number>().as('n')])
      .groupBy(['attempts.cohort_id', attemptDay]).execute()),
    byCohortParts(db, scope, part => applyReviewFilters(db.selectFrom('attempt_slips'), 'attempt_slips', f, part, { eye: true })
      .select(eb => ['attempt_slips.cohort_id', slipDay.as('day'), 'attempt_slips.code', eb.fn.countAll<number>().as('n')])
      .groupBy(['attempt_slips.cohort_id', slipDay, 'attempt_slips.code']).execute()),
  ])
  // rows come per cohort, day (and code): each day's week is worked out once
  const weeks = new Map<string, TrendWeek>()
  const byDay = new Map<string, TrendWeek>()
  const at = (d: string) => {
    let entry = byDay.get(d)
    if (entry) return entry
    const w = weekOf(d)
    entry = weeks.get(w)
    if (!entry) weeks.set(w, entry = { week: w, attempts: 0, slips: {} })
    byDay.set(d, entry)
    return entry
  }
  for (const r of attemptDays) at(r.day).attempts += Number(r.n)
  for (const r of slipDays) {
    if (!isSlipCode(r.code)) continue
    const w = at(r.day)
    w.slips[r.code] = (w.slips[r.code] ?? 0) + Number(r.n)
  }
  return [...weeks.values()].sort((a, b) => a.week.localeCompare(b.week))
}
