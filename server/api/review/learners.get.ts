// GET /api/review/learners (tutor, lecturer): same filters + `limit` (1–200, default 50)
// → `{ items: [{ learner, attempts, slipAttempts, reversed: { reOnly, leOnly, both },
// ruleSwap: { RE, LE } /* one-eye reversals beside a torted, rightly recorded other eye
// */, patterns: [{ code, title, eye?, count, of, examples: [attemptId] }], score }],
// total, learnersSeen }`, most help needed first
import { reviewLearnersQuery } from '#shared/schemas/review'
import type { LearnersResponse } from '#shared/types/review'
import { needsHelp } from '~~/server/lib/review/learners'
import { reviewRequest } from '~~/server/lib/review/request'

/** The ranked "needs help" list: learners showing slip patterns, with the evidence. */
export default defineEventHandler(async (event): Promise<LearnersResponse> => {
  const { query, db, scope } = await reviewRequest(event, reviewLearnersQuery)
  const { limit, ...filters } = query
  return { filters, ...(await needsHelp(db, filters, scope, limit)) }
})
