// POST /api/quizzes/:id/fundus-attempts/:attemptId/overrides (manager (a tutor: their
// cohorts' students; others `404`)): `{ criterion: 'fundusAngle' \| 'fundusFinding',
// score, reason }` on the attempt that counts; audit-logged → `201` the attempt
import { ITEM_KINDS } from '~~/server/lib/quiz/item-kinds'
import { overrideQuizMark } from '~~/server/lib/quiz/attempt-routes'
import type { QuizFundusAttemptView } from '#shared/types/quiz'

export default defineEventHandler((event): Promise<QuizFundusAttemptView> => overrideQuizMark(event, ITEM_KINDS.fundus))
