// GET /api/review/trend (tutor, lecturer): same filters → `{ weeks: [{ week /* Monday
// */, attempts, slips: { code: n } }], codes }`
import { SLIP_CODES } from '#shared/engine/slips'
import { reviewFilterQuery } from '#shared/schemas/review'
import type { TrendResponse } from '#shared/types/review'
import { weeklyTrend } from '~~/server/lib/review/aggregates'
import { reviewRequest } from '~~/server/lib/review/request'

/** Attempts and slips per week. */
export default defineEventHandler(async (event): Promise<TrendResponse> => {
  const { query, db, scope } = await reviewRequest(event, reviewFilterQuery)
  const weeks = await weeklyTrend(db, query, scope)
  const codes = SLIP_CODES.filter(c => weeks.some(w => w.slips[c]))
  return { filters: query, weeks, codes }
})
