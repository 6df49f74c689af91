// GET /api/quizzes/:id/fundus-attempts/:attemptId (manager (a tutor: their cohorts'
// students), or the student who made it): a fundus item's attempt: `{ item: { eyes },
// attempt: { marks, submittedAt }, presentation \| pictures \| photo /* the student gets
// pictures until feedback opens */, counts, feedbackOpen, reference, result: { result /*
// the fundus grading */, marks, points, score, comparison }, overrides }`; `reference`
// and `result` only for staff, or the student once feedback is open; another student's
// attempt is `404` (results columns say `kind: 'fundus'` to link here)
import { quizAttemptParams } from '#shared/schemas/quiz'
import { assertStudentInReach, quizForStaff, quizForStudent } from '~~/server/lib/quiz/access'
import { quizFundusAttemptView } from '~~/server/lib/quiz/fundus-attempt-view'
import type { QuizFundusAttemptView } from '#shared/types/quiz'

// A fundus item's attempt: staff open any attempt of a quiz they manage; a student
// only their own (anyone else's is 404), and its marks only once feedback is open.
export default defineEventHandler(async (event): Promise<QuizFundusAttemptView> => {
  const user = await requireSignedIn(event)
  const { id, attemptId } = paramsAs(event, quizAttemptParams)
  const db = await useDb()
  const quiz = user.role === 'student' ? await quizForStudent(db, user, id) : await quizForStaff(db, user, id)
  let q = db.selectFrom('fundus_attempts').selectAll().where('id', '=', attemptId).where('quiz_id', '=', id).where('kind', '=', 'quiz')
  if (user.role === 'student') q = q.where('learner_id', '=', user.id)
  const attempt = await q.executeTakeFirst()
  if (!attempt) notFound('That attempt')
  // a tutor reaches only their own cohorts' students
  await assertStudentInReach(db, user, id, attempt.learner_id)
  return quizFundusAttemptView(db, user, quiz, attempt)
})
