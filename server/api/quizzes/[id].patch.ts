// PATCH /api/quizzes/:id (owner, lecturer, admin (another tutor `403`)): any setting,
// `cohortIds`, `published`, `archived`; publishing needs an item, a cohort and both
// times; items and the interpretation setting are fixed (`409`) once a student has
// started; after release the close time may come forward but not move later or go (`409`
// naming `closesAt`)
import { idParam } from '#shared/schemas/common'
import { QUIZ_STAFF } from '#shared/auth/roles'
import { quizPatchBody } from '#shared/schemas/quiz'
import type { StaffQuizDetail } from '#shared/types/quiz'
import { assertManagesQuiz, quizForStaff } from '~~/server/lib/quiz/access'
import { staffQuizDetail } from '~~/server/lib/quiz/detail'
import { updateQuiz } from '~~/server/lib/quiz/update'

export default defineEventHandler(async (event): Promise<StaffQuizDetail> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id } = paramsAs(event, idParam)
  const body = await readBodyAs(event, quizPatchBody)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  assertManagesQuiz(user, quiz)
  await updateQuiz(db, user, quiz, body)
  const fresh = await db.selectFrom('quizzes').selectAll().where('id', '=', id).executeTakeFirstOrThrow()
  return staffQuizDetail(db, user, fresh)
})
