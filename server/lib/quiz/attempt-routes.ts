// The two attempt routes every quiz item kind has, written once over the kind's
// registry entry (server/lib/quiz/item-kinds.ts); the route files under
// server/api/quizzes/[id]/<kind's attemptPath>/ only name their kind.
import type { H3Event } from 'h3'
import { QUIZ_STAFF } from '#shared/auth/roles'
import type { QuizItemKind } from '#shared/schemas/quiz'
import { overrideBody, quizAttemptParams } from '#shared/schemas/quiz'
import { countingQuizAttempt } from '~~/server/lib/data/attempts'
import { quizItem } from '~~/server/lib/data/quiz-items'
import { assertStudentInReach, quizForStaff, quizForStudent } from './access'
import type { ItemKind, QuizAttemptBase } from './item-kinds'
import type { QuizItemConfig } from './items'
import { readItemConfig } from './items'
import { assertCountingAttempt, storeMarkOverride } from './overrides'

type Kind<Row extends QuizAttemptBase, View> = ItemKind<QuizItemKind, Row, QuizItemConfig, View>

/**
 * `GET /api/quizzes/:id/<attemptPath>/:attemptId`: staff open any attempt of a quiz
 * they manage (a tutor: their cohorts' students); a student only their own (anyone
 * else's is 404), and its marks only once feedback is open (the kind's view decides).
 */
export async function openQuizAttempt<Row extends QuizAttemptBase, View>(event: H3Event, kind: Kind<Row, View>): Promise<View> {
  const user = await requireSignedIn(event)
  const { id, attemptId } = paramsAs(event, quizAttemptParams)
  const db = await useDb()
  const quiz = user.role === 'student' ? await quizForStudent(db, user, id) : await quizForStaff(db, user, id)
  const attempt = await kind.attempt(db, { quizId: id, attemptId, learnerId: user.role === 'student' ? user.id : undefined })
  if (!attempt) notFound('That attempt')
  // a tutor reaches only their own cohorts' students
  await assertStudentInReach(db, user, id, attempt.learner_id)
  return kind.view(db, user, quiz, attempt)
}

/**
 * `POST /api/quizzes/:id/<attemptPath>/:attemptId/overrides`: change one criterion's
 * mark on the attempt that counts, with a reason; audit-logged in the same
 * transaction → `201` the attempt's view.
 */
export async function overrideQuizMark<Row extends QuizAttemptBase, View>(event: H3Event, kind: Kind<Row, View>): Promise<View> {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id, attemptId } = paramsAs(event, quizAttemptParams)
  const body = await readBodyAs(event, overrideBody)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  const attempt = await kind.attempt(db, { quizId: id, attemptId })
  if (!attempt) notFound('That attempt')
  // a tutor changes only their own cohorts' students' marks
  await assertStudentInReach(db, user, id, attempt.learner_id)
  const latest = await countingQuizAttempt(db, kind.attemptTable, { quizId: id, itemId: attempt.quiz_item_id, learnerId: attempt.learner_id })
  assertCountingAttempt(attempt.id, latest.id)
  const problem = kind.criterionProblem(body.criterion)
  if (problem) badRequest([{ path: 'criterion', message: problem }])
  const item = await quizItem(db, attempt.quiz_item_id!)
  const overrides = (await kind.overrides(db, id)).filter(o => o.attempt_id === attempt.id)
  const mark = kind.marks(attempt, readItemConfig(item), quiz.interpretation === 1, overrides).find(m => m.criterion === body.criterion)
  if (!mark) badRequest([{ path: 'criterion', message: `This attempt has no “${body.criterion}” mark to change.` }])
  await storeMarkOverride(db, {
    kind, attemptId: attempt.id, quizId: id, studentId: attempt.learner_id, itemId: attempt.quiz_item_id,
    criterion: body.criterion, from: mark.score, to: body.score, reason: body.reason, actorId: user.id,
  })
  setResponseStatus(event, 201)
  return kind.view(db, user, quiz, attempt)
}
