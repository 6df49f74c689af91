import { reviewFilterQuery } from '#shared/schemas/review'
import type { SlipsResponse } from '#shared/types/review'
import { directionTable, reviewTotals, slipCounts } from '~~/server/utils/review/aggregates'
import { reviewRequest } from '~~/server/utils/review/request'

/** Counts by slip code and the direction table for the filtered attempts. */
export default defineEventHandler(async (event): Promise<SlipsResponse> => {
  const { query, db, scope } = await reviewRequest(event, reviewFilterQuery)
  const totals = await reviewTotals(db, query, scope)
  const [slips, directions] = await Promise.all([slipCounts(db, query, scope, totals.attempts), directionTable(db, query, scope)])
  return { filters: query, totals, slips, directions }
})
