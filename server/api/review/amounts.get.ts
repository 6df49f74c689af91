// GET /api/review/amounts (tutor, lecturer): same filters → `{ bands: [{ band, label,
// RE, LE }], recorded: { RE, LE } }` (recorded amount − true amount, degrees)
import { reviewFilterQuery } from '#shared/schemas/review'
import type { AmountsResponse } from '#shared/types/review'
import { amountBands } from '~~/server/lib/review/aggregates'
import { reviewRequest } from '~~/server/lib/review/request'

/** How far recorded amounts are from the true magnitude, in bands, per eye. */
export default defineEventHandler(async (event): Promise<AmountsResponse> => {
  const { query, db, scope } = await reviewRequest(event, reviewFilterQuery)
  return { filters: query, ...(await amountBands(db, query, scope)) }
})
