// The review page's aggregates, computed in SQL. Each is one pass over a
// covering index (migration 0004): conditional sums instead of GROUP BY where
// the groups are known in advance, so SQLite never sorts the filtered rows.
import { sql } from 'kysely'
import type { Kysely, RawBuilder } from 'kysely'
import type { Database } from '~~/db/schema'
import { SLIP_CODES, SLIP_INFO } from '#shared/engine/slips'
import type { SlipCode } from '#shared/engine/slips'
import { EYES } from '#shared/engine/types'
import type { Eye } from '#shared/engine/types'
import { AMOUNT_BAND_EDGES, weekOf } from '#shared/review/bands'
import type { BandEdge } from '#shared/review/bands'
import type { ReviewFilters } from '#shared/schemas/review'
import type { AmountBandCount, DirectionTable, ReviewTotals, SlipCount, TrendWeek } from '#shared/types/review'
import { applyReviewFilters } from './filters'
import type { ReviewScope } from './scope'

const eyeCol = (eye: Eye, what: 'true_direction' | 'recorded_direction' | 'amount_error') => sql.ref(`attempts.${eye.toLowerCase()}_${what}`)
const count = (cond: RawBuilder<unknown>) => sql<number>`coalesce(sum(case when ${cond} then 1 else 0 end), 0)`

export async function reviewTotals(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope): Promise<ReviewTotals> {
  const row = await applyReviewFilters(db.selectFrom('attempts'), 'attempts', f, scope)
    .select(eb => [eb.fn.countAll<number>().as('attempts'), eb.fn.count<number>('attempts.learner_id').distinct().as('learners')])
    .executeTakeFirstOrThrow()
  return { attempts: Number(row.attempts), learners: Number(row.learners) }
}

export async function slipCounts(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope, attempts: number): Promise<SlipCount[]> {
  const row = await applyReviewFilters(db.selectFrom('attempt_slips'), 'attempt_slips', f, scope, { eye: true })
    .select(SLIP_CODES.map(code => count(sql`${sql.ref('attempt_slips.code')} = ${code}`).as(code)))
    .executeTakeFirstOrThrow() as Record<SlipCode, number>
  return SLIP_CODES
    .map(code => ({ code, title: SLIP_INFO[code].title, count: Number(row[code] ?? 0), per100: attempts ? Math.round(1000 * Number(row[code] ?? 0) / attempts) / 10 : 0 }))
    .sort((a, b) => b.count - a.count || SLIP_CODES.indexOf(a.code) - SLIP_CODES.indexOf(b.code))
}

const TRUE_DIRS = ['excyclo', 'incyclo'] as const
const RECORDED = ['excyclo', 'incyclo', 'none', 'missing'] as const

function recordedIs(eye: Eye, r: (typeof RECORDED)[number]): RawBuilder<unknown> {
  return r === 'missing' ? sql`${eyeCol(eye, 'recorded_direction')} is null` : sql`${eyeCol(eye, 'recorded_direction')} = ${r}`
}

/** True excyclo/incyclo × recorded direction, per eye (attempts whose eye had a direction to record). */
export async function directionTable(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope): Promise<DirectionTable> {
  const eyes = f.eye ? [f.eye] : EYES
  const selections = eyes.flatMap(eye => TRUE_DIRS.flatMap(t => RECORDED.map(r =>
    count(sql`${eyeCol(eye, 'true_direction')} = ${t} and ${recordedIs(eye, r)}`).as(`${eye}_${t}_${r}`))))
  const row = await applyReviewFilters(db.selectFrom('attempts'), 'attempts', f, scope)
    .select(selections).executeTakeFirstOrThrow() as Record<string, number>
  const table = {} as DirectionTable
  for (const eye of EYES) {
    table[eye] = {
      excyclo: { excyclo: 0, incyclo: 0, none: 0, missing: 0 },
      incyclo: { excyclo: 0, incyclo: 0, none: 0, missing: 0 },
    }
    if (!eyes.includes(eye)) continue
    for (const t of TRUE_DIRS) for (const r of RECORDED) table[eye][t][r] = Number(row[`${eye}_${t}_${r}`] ?? 0)
  }
  return table
}

/** The SQL condition for one amount band on one eye's signed error. */
export function bandCondition(eye: Eye, b: BandEdge): RawBuilder<unknown> {
  const e = eyeCol(eye, 'amount_error')
  const parts: RawBuilder<unknown>[] = [sql`${e} is not null`]
  if (b.min !== null) parts.push(b.minInclusive ? sql`${e} >= ${b.min}` : sql`${e} > ${b.min}`)
  if (b.max !== null) parts.push(b.maxInclusive ? sql`${e} <= ${b.max}` : sql`${e} < ${b.max}`)
  return sql.join(parts, sql` and `)
}

export async function amountBands(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope): Promise<{ bands: AmountBandCount[], recorded: Record<Eye, number> }> {
  const eyes = f.eye ? [f.eye] : EYES
  const selections = eyes.flatMap(eye => [
    ...AMOUNT_BAND_EDGES.map(b => count(bandCondition(eye, b)).as(`${eye}_${b.band}`)),
    count(sql`${eyeCol(eye, 'amount_error')} is not null`).as(`${eye}_recorded`),
  ])
  const row = await applyReviewFilters(db.selectFrom('attempts'), 'attempts', f, scope)
    .select(selections).executeTakeFirstOrThrow() as Record<string, number>
  const n = (k: string) => Number(row[k] ?? 0)
  return {
    bands: AMOUNT_BAND_EDGES.map(b => ({ band: b.band, label: b.label, RE: n(`RE_${b.band}`), LE: n(`LE_${b.band}`) })),
    recorded: { RE: n('RE_recorded'), LE: n('LE_recorded') },
  }
}

/** Attempts and slips per week (Monday first). Grouped by day in SQL, folded into weeks here. */
export async function weeklyTrend(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope): Promise<TrendWeek[]> {
  const day = (col: string) => sql<string>`substr(${sql.ref(col)}, 1, 10)`
  const attemptDays = await applyReviewFilters(db.selectFrom('attempts'), 'attempts', f, scope)
    .select(eb => [day('attempts.submitted_at').as('day'), eb.fn.countAll<number>().as('n')])
    .groupBy(day('attempts.submitted_at')).execute()
  const slipDays = await applyReviewFilters(db.selectFrom('attempt_slips'), 'attempt_slips', f, scope, { eye: true })
    .select(eb => [day('attempt_slips.created_at').as('day'), 'attempt_slips.code', eb.fn.countAll<number>().as('n')])
    .groupBy([day('attempt_slips.created_at'), 'attempt_slips.code']).execute()
  const weeks = new Map<string, TrendWeek>()
  const at = (d: string) => {
    const w = weekOf(d)
    let entry = weeks.get(w)
    if (!entry) weeks.set(w, entry = { week: w, attempts: 0, slips: {} })
    return entry
  }
  for (const r of attemptDays) at(r.day).attempts += Number(r.n)
  for (const r of slipDays) {
    const w = at(r.day)
    const code = r.code as SlipCode
    w.slips[code] = (w.slips[code] ?? 0) + Number(r.n)
  }
  return [...weeks.values()].sort((a, b) => a.week.localeCompare(b.week))
}
