// GET /api/quizzes/:id/fundus-attempts/:attemptId (manager (a tutor: their cohorts'
// students), or the student who made it): a fundus item's attempt: `{ item: { eyes },
// attempt: { marks, submittedAt }, presentation \| pictures \| photo /* the student gets
// pictures until feedback opens */, counts, feedbackOpen, reference, result: { result /*
// the fundus grading */, marks, points, score, comparison }, overrides }`; `reference`
// and `result` only for staff, or the student once feedback is open; another student's
// attempt is `404` (results columns say `kind: 'fundus'` to link here)
import { ITEM_KINDS } from '~~/server/lib/quiz/item-kinds'
import { openQuizAttempt } from '~~/server/lib/quiz/attempt-routes'
import type { QuizFundusAttemptView } from '#shared/types/quiz'

export default defineEventHandler((event): Promise<QuizFundusAttemptView> => openQuizAttempt(event, ITEM_KINDS.fundus))
