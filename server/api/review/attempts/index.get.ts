// GET /api/review/attempts (tutor, lecturer): same filters + `code`, `learnerId`,
// `trueDirection`, `recordedDirection`, `amountBand` (the last three need `eye`),
// `page`, `pageSize` → `{ items: [{ id, learner, cohort, kind, quizId, quizTitle,
// templateId, condition, submittedAt, score, record, slips }], total, page, pageSize }`
import { reviewAttemptsQuery } from '#shared/schemas/review'
import type { ReviewAttemptsResponse } from '#shared/types/review'
import { drillAttempts } from '~~/server/lib/review/drill'
import { reviewRequest } from '~~/server/lib/review/request'
import { learnerInScope } from '~~/server/lib/review/scope'

/** The attempts behind a number on the review page. */
export default defineEventHandler(async (event): Promise<ReviewAttemptsResponse> => {
  const { query, db, scope } = await reviewRequest(event, reviewAttemptsQuery)
  if (query.learnerId && !(await learnerInScope(db, scope, query.learnerId))) notFound('That learner')
  return drillAttempts(db, query, scope)
})
