// GET /api/review/export.csv (tutor, lecturer): `table`
// (`slips`\|`directions`\|`amounts`\|`trend`\|`learners`\|`attempts`) + the same filters
// → `text/csv` (cells that a spreadsheet would run as a formula get a leading `'`)
import { REVIEW_ROLES } from '#shared/auth/roles'
import { z } from 'zod'
import { EXPORT_TABLES, reviewAttemptsQuery, reviewFilterQuery, reviewLearnersQuery } from '#shared/schemas/review'
import { AMOUNT_BAND_EDGES } from '#shared/review/bands'
import { amountBands, directionTable, reviewTotals, slipCodeCounts, slipTable, weeklyTrend } from '~~/server/lib/review/aggregates'
import { toCsv } from '~~/server/lib/review/csv'
import type { Cell } from '~~/server/lib/review/csv'
import { drillAttempts } from '~~/server/lib/review/drill'
import { needsHelp } from '~~/server/lib/review/learners'
import { learnerInScope, reviewScopeFor } from '~~/server/lib/review/scope'

const tableQuery = z.object({ table: z.enum(EXPORT_TABLES, { error: `Table must be one of ${EXPORT_TABLES.join(', ')}.` }) })

/** The current view of the review page as CSV: one table, the same filters. */
export default defineEventHandler(async (event): Promise<string> => {
  const user = await requireRole(event, ...REVIEW_ROLES)
  const { table } = queryAs(event, tableQuery.loose())
  const db = await useDb()
  let header: string[]
  let rows: Cell[][]

  if (table === 'attempts') {
    const q = queryAs(event, reviewAttemptsQuery)
    const scope = await reviewScopeFor(db, user, q.cohortId)
    if (q.learnerId && !(await learnerInScope(db, scope, q.learnerId))) notFound('That learner')
    const { items } = await drillAttempts(db, q, scope, true)
    header = ['attempt', 'submitted', 'learner', 'cohort', 'kind', 'quiz', 'template', 'condition', 'score', 'slips', 'record']
    rows = items.map(a => [a.id, a.submittedAt, a.learner.name, a.cohort, a.kind, a.quizTitle ?? a.quizId, a.templateId, a.condition, Math.round(a.score * 100) / 100,
      a.slips.map(s => (s.eye ? `${s.code} (${s.eye})` : s.code)).join('; '), a.record])
  }
  else if (table === 'learners') {
    const q = queryAs(event, reviewLearnersQuery)
    const { limit: _limit, ...filters } = q
    const scope = await reviewScopeFor(db, user, q.cohortId)
    const { items } = await needsHelp(db, filters, scope, 200)
    header = ['rank', 'learner', 'cohort', 'attempts', 'attempts with slips', 'pattern', 'eye', 'attempts showing it', 'example attempts']
    rows = items.flatMap((l, i) => l.patterns.map(p => [i + 1, l.learner.name, l.learner.cohort, l.attempts, l.slipAttempts, p.title, p.eye ?? '', p.count, p.examples.join(' ')]))
  }
  else {
    const q = queryAs(event, reviewFilterQuery)
    const scope = await reviewScopeFor(db, user, q.cohortId)
    if (table === 'slips') {
      const [totals, counts] = await Promise.all([reviewTotals(db, q, scope), slipCodeCounts(db, q, scope)])
      header = ['slip code', 'slip', 'slips', 'per 100 attempts']
      rows = slipTable(counts, totals.attempts).map(s => [s.code, s.title, s.count, s.per100])
    }
    else if (table === 'directions') {
      const t = await directionTable(db, q, scope)
      header = ['eye', 'true direction', 'recorded excyclo', 'recorded incyclo', 'recorded no torsion', 'direction not stated']
      rows = (q.eye ? [q.eye] : ['RE', 'LE'] as const).flatMap(eye => (['excyclo', 'incyclo'] as const).map(d => [eye, d, t[eye][d].excyclo, t[eye][d].incyclo, t[eye][d].none, t[eye][d].missing]))
    }
    else if (table === 'amounts') {
      const a = await amountBands(db, q, scope)
      header = ['band', 'amount error', 'RE', 'LE']
      rows = a.bands.map(b => [b.band, AMOUNT_BAND_EDGES.find(e => e.band === b.band)!.label, b.RE, b.LE])
    }
    else {
      const weeks = await weeklyTrend(db, q, scope)
      const codes = [...new Set(weeks.flatMap(w => Object.keys(w.slips)))].sort()
      header = ['week beginning', 'attempts', ...codes]
      rows = weeks.map(w => [w.week, w.attempts, ...codes.map(c => w.slips[c as keyof typeof w.slips] ?? 0)])
    }
  }

  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="cyclodial-slip-patterns-${table}.csv"`)
  return toCsv(header, rows)
})
