// POST /api/quizzes/:id/attempts/:attemptId/overrides (manager (a tutor: their cohorts'
// students; others `404`)): `{ criterion, score /* 0–1 */, reason }` on the attempt that
// counts; audit-logged → `201` the attempt
import { ITEM_KINDS } from '~~/server/lib/quiz/item-kinds'
import { overrideQuizMark } from '~~/server/lib/quiz/attempt-routes'
import type { QuizAttemptView } from '#shared/types/quiz'

export default defineEventHandler((event): Promise<QuizAttemptView> => overrideQuizMark(event, ITEM_KINDS.dmr))
