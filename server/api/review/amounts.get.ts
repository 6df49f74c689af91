import { reviewFilterQuery } from '#shared/schemas/review'
import type { AmountsResponse } from '#shared/types/review'
import { amountBands } from '~~/server/utils/review/aggregates'
import { reviewRequest } from '~~/server/utils/review/request'

/** How far recorded amounts are from the true magnitude, in bands, per eye. */
export default defineEventHandler(async (event): Promise<AmountsResponse> => {
  const { query, db, scope } = await reviewRequest(event, reviewFilterQuery)
  return { filters: query, ...(await amountBands(db, query, scope)) }
})
