// GET /api/quizzes/:id/attempts/:attemptId (manager (a tutor: their cohorts' students),
// or the student who made it): the attempt as left (gaze, distance, readings, prisms,
// lights, record, trial), the patient's turn, the presentation and — for staff, or the
// student once feedback is open — the marks with overrides; another student's attempt is
// `404`
import { ITEM_KINDS } from '~~/server/lib/quiz/item-kinds'
import { openQuizAttempt } from '~~/server/lib/quiz/attempt-routes'
import type { QuizAttemptView } from '#shared/types/quiz'

export default defineEventHandler((event): Promise<QuizAttemptView> => openQuizAttempt(event, ITEM_KINDS.dmr))
