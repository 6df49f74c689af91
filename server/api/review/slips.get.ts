// GET /api/review/slips (tutor (own cohorts), lecturer): filters as query parameters,
// all optional: `cohortId`, `kind` (`practice`\|`quiz`), `quizId`, `from`, `to` (days,
// `YYYY-MM-DD`, inclusive), `template` (base or full case-template id), `condition`,
// `eye` (`RE`\|`LE`) → `{ filters, totals: { attempts }, slips: [{ code, title, count,
// per100 }], directions: { RE, LE: { excyclo, incyclo: { excyclo, incyclo, none, missing
// } } } }` — counts by slip code (a slip in both eyes counts twice; the eye filter keeps
// slips about that eye) and the direction table (true direction × recorded, attempts
// whose eye had a direction). A cohort outside the caller's is `404`; students and
// administrators `403`
import { reviewFilterQuery } from '#shared/schemas/review'
import type { SlipsResponse } from '#shared/types/review'
import { directionTable, slipCodeCounts, slipTable } from '~~/server/lib/review/aggregates'
import { reviewRequest } from '~~/server/lib/review/request'

/** Counts by slip code and the direction table for the filtered attempts. */
export default defineEventHandler(async (event): Promise<SlipsResponse> => {
  const { query, db, scope } = await reviewRequest(event, reviewFilterQuery)
  // the direction query visits every attempt in the view, so it also gives the total;
  // both queries are sent together (on PostgreSQL, two pooled connections)
  const [{ attempts, ...directions }, counts] = await Promise.all([directionTable(db, query, scope), slipCodeCounts(db, query, scope)])
  return { filters: query, totals: { attempts }, slips: slipTable(counts, attempts), directions }
})
