// POST /api/quizzes/:id/fundus-attempts/:attemptId/overrides (manager (a tutor: their
// cohorts' students; others `404`)): `{ criterion: 'fundusAngle' \| 'fundusFinding',
// score, reason }` on the attempt that counts; audit-logged → `201` the attempt
import { QUIZ_STAFF } from '#shared/auth/roles'
import { KIND_CRITERIA, overrideBody, quizAttemptParams } from '#shared/schemas/quiz'
import { assertStudentInReach, quizForStaff } from '~~/server/lib/quiz/access'
import { assertCountingAttempt, storeMarkOverride } from '~~/server/lib/quiz/overrides'
import { quizFundusAttemptView } from '~~/server/lib/quiz/fundus-attempt-view'
import type { FundusItemConfig } from '~~/server/lib/quiz/items'
import { readItemConfig } from '~~/server/lib/quiz/items'
import { fundusMarksOf, loadFundusOverrides } from '~~/server/lib/quiz/fundus-marks'
import { applyOverrides } from '~~/server/lib/quiz/results'
import type { FundusGradeResult } from '#shared/engine/fundus/result'
import { countingFundusAttempt } from '~~/server/lib/data/attempts'
import { quizItem } from '~~/server/lib/data/quiz-items'
import type { QuizFundusAttemptView } from '#shared/types/quiz'

// Change one criterion's mark on a fundus attempt that counts, with a reason;
// audit-logged in the same transaction (as for double Maddox rod attempts).
export default defineEventHandler(async (event): Promise<QuizFundusAttemptView> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id, attemptId } = paramsAs(event, quizAttemptParams)
  const body = await readBodyAs(event, overrideBody)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  const attempt = await db.selectFrom('fundus_attempts').selectAll().where('id', '=', attemptId).where('quiz_id', '=', id).where('kind', '=', 'quiz').executeTakeFirst()
  if (!attempt) notFound('That attempt')
  // a tutor changes only their own cohorts' students' marks
  await assertStudentInReach(db, user, id, attempt.learner_id)
  const latest = await countingFundusAttempt(db, { quizId: id, itemId: attempt.quiz_item_id, learnerId: attempt.learner_id })
  assertCountingAttempt(attempt.id, latest.id)
  if (!KIND_CRITERIA.fundus.includes(body.criterion)) {
    badRequest([{ path: 'criterion', message: `A fundus item marks ${KIND_CRITERIA.fundus.join(' and ')}; it has no “${body.criterion}” mark.` }])
  }
  const item = await quizItem(db, attempt.quiz_item_id!)
  const config = readItemConfig(item) as FundusItemConfig
  const overrides = (await loadFundusOverrides(db, id)).filter(o => o.attempt_id === attempt.id)
  const mark = applyOverrides(fundusMarksOf(JSON.parse(attempt.result_json) as FundusGradeResult, config.weights), overrides).find(m => m.criterion === body.criterion)!
  await storeMarkOverride(db, {
    kind: 'fundus', attemptId: attempt.id, quizId: id, studentId: attempt.learner_id, itemId: attempt.quiz_item_id,
    criterion: body.criterion, from: mark.score, to: body.score, reason: body.reason, actorId: user.id,
  })
  setResponseStatus(event, 201)
  return quizFundusAttemptView(db, user, quiz, attempt)
})
