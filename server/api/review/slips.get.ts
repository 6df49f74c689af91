import { reviewFilterQuery } from '#shared/schemas/review'
import type { SlipsResponse } from '#shared/types/review'
import { directionTable, slipCounts } from '~~/server/lib/review/aggregates'
import { reviewRequest } from '~~/server/lib/review/request'

/** Counts by slip code and the direction table for the filtered attempts. */
export default defineEventHandler(async (event): Promise<SlipsResponse> => {
  const { query, db, scope } = await reviewRequest(event, reviewFilterQuery)
  // the direction query visits every attempt in the view, so it also gives the total
  const { attempts, ...directions } = await directionTable(db, query, scope)
  const slips = await slipCounts(db, query, scope, attempts)
  return { filters: query, totals: { attempts }, slips, directions }
})
