// POST /api/quizzes/:id/finish (student, assigned): finish the sitting early.
import { idParam } from '#shared/schemas/common'
import { quizForStudent } from '~~/server/lib/quiz/access'
import { studentQuizDetail } from '~~/server/lib/quiz/student'
import { sittingOf } from '~~/server/lib/quiz/sitting'
import { assertSittingOpen } from '~~/server/lib/quiz/timing'
import type { StudentQuizDetail } from '#shared/types/quiz'

// Finishing ends the sitting early: nothing can be changed after it.
export default defineEventHandler(async (event): Promise<StudentQuizDetail> => {
  const user = await requireRole(event, 'student')
  const { id } = paramsAs(event, idParam)
  const db = await useDb()
  const quiz = await quizForStudent(db, user, id)
  const sitting = assertSittingOpen(quiz, await sittingOf(db, id, user.id))
  await db.updateTable('quiz_sittings').set({ finished_at: nowIso() }).where('id', '=', sitting.id).where('finished_at', 'is', null).execute()
  return studentQuizDetail(db, user, quiz)
})
