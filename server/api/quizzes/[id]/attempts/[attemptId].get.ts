// GET /api/quizzes/:id/attempts/:attemptId (manager (a tutor: their cohorts' students),
// or the student who made it): the attempt as left (gaze, distance, readings, prisms,
// lights, record, trial), the patient's turn, the presentation and — for staff, or the
// student once feedback is open — the marks with overrides; another student's attempt is
// `404`
import { quizAttemptParams } from '#shared/schemas/quiz'
import { assertStudentInReach, quizForStaff, quizForStudent } from '~~/server/lib/quiz/access'
import { quizAttemptView } from '~~/server/lib/quiz/attempt-view'
import type { QuizAttemptView } from '#shared/types/quiz'

// Staff open any attempt of a quiz they manage; a student only their own (anyone
// else's is 404), and its marks only once feedback is open.
export default defineEventHandler(async (event): Promise<QuizAttemptView> => {
  const user = await requireSignedIn(event)
  const { id, attemptId } = paramsAs(event, quizAttemptParams)
  const db = await useDb()
  const quiz = user.role === 'student' ? await quizForStudent(db, user, id) : await quizForStaff(db, user, id)
  let q = db.selectFrom('attempts').selectAll().where('id', '=', attemptId).where('quiz_id', '=', id).where('kind', '=', 'quiz')
  if (user.role === 'student') q = q.where('learner_id', '=', user.id)
  const attempt = await q.executeTakeFirst()
  if (!attempt) notFound('That attempt')
  // a tutor reaches only their own cohorts' students
  await assertStudentInReach(db, user, id, attempt.learner_id)
  return quizAttemptView(db, user, quiz, attempt)
})
