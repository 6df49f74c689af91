// GET /api/quizzes/:id (manager / assigned student): staff: settings, cohorts, items
// (source, mode, tolerance, weights), `locked`; a student: the sitting and each item's
// prompt and progress — marks, slips and the truth only once feedback is open. Anyone
// else `404`
import { idParam } from '#shared/schemas/common'
import { quizForStaff, quizForStudent } from '~~/server/lib/quiz/access'
import { staffQuizDetail } from '~~/server/lib/quiz/detail'
import { studentQuizDetail } from '~~/server/lib/quiz/student'
import type { StaffQuizDetail, StudentQuizDetail } from '#shared/types/quiz'

export default defineEventHandler(async (event): Promise<StaffQuizDetail | StudentQuizDetail> => {
  const user = await requireSignedIn(event)
  const { id } = paramsAs(event, idParam)
  const db = await useDb()
  if (user.role === 'student') return studentQuizDetail(db, user, await quizForStudent(db, user, id))
  return staffQuizDetail(db, user, await quizForStaff(db, user, id))
})
