// POST /api/quizzes/:id/attempts/:attemptId/overrides (manager (a tutor: their cohorts'
// students; others `404`)): `{ criterion, score /* 0–1 */, reason }` on the attempt that
// counts; audit-logged → `201` the attempt
import { QUIZ_STAFF } from '#shared/auth/roles'
import { overrideBody, quizAttemptParams } from '#shared/schemas/quiz'
import { assertStudentInReach, quizForStaff } from '~~/server/lib/quiz/access'
import { assertCountingAttempt, storeMarkOverride } from '~~/server/lib/quiz/overrides'
import { quizAttemptView } from '~~/server/lib/quiz/attempt-view'
import { readItemConfig } from '~~/server/lib/quiz/items'
import { effectiveMarks, loadOverrides } from '~~/server/lib/quiz/results'
import { countingAttempt } from '~~/server/lib/data/attempts'
import { quizItem } from '~~/server/lib/data/quiz-items'
import type { QuizAttemptView } from '#shared/types/quiz'

// Change one criterion's mark on the attempt that counts, with a reason; audit-logged
// in the same transaction.
export default defineEventHandler(async (event): Promise<QuizAttemptView> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id, attemptId } = paramsAs(event, quizAttemptParams)
  const body = await readBodyAs(event, overrideBody)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  const attempt = await db.selectFrom('attempts').selectAll().where('id', '=', attemptId).where('quiz_id', '=', id).where('kind', '=', 'quiz').executeTakeFirst()
  if (!attempt) notFound('That attempt')
  // a tutor changes only their own cohorts' students' marks
  await assertStudentInReach(db, user, id, attempt.learner_id)
  const latest = await countingAttempt(db, { quizId: id, itemId: attempt.quiz_item_id, learnerId: attempt.learner_id })
  assertCountingAttempt(attempt.id, latest.id)
  const item = await quizItem(db, attempt.quiz_item_id!)
  const overrides = (await loadOverrides(db, id)).filter(o => o.attempt_id === attempt.id)
  const mark = effectiveMarks(attempt, readItemConfig(item), quiz.interpretation === 1, overrides).find(m => m.criterion === body.criterion)
  if (!mark) badRequest([{ path: 'criterion', message: `This attempt has no “${body.criterion}” mark to change.` }])
  await storeMarkOverride(db, {
    kind: 'dmr', attemptId: attempt.id, quizId: id, studentId: attempt.learner_id, itemId: attempt.quiz_item_id,
    criterion: body.criterion, from: mark.score, to: body.score, reason: body.reason, actorId: user.id,
  })
  setResponseStatus(event, 201)
  return quizAttemptView(db, user, quiz, attempt)
})
