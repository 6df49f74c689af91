// DELETE /api/quizzes/:id/items/:itemId (owner, lecturer, admin; another tutor 403):
// remove an item (409 once the quiz is locked).
import { QUIZ_STAFF } from '#shared/auth/roles'
import { quizItemParams } from '#shared/schemas/quiz'
import { assertManagesQuiz, quizForStaff } from '~~/server/lib/quiz/access'
import { assertUnlocked, staffQuizDetail } from '~~/server/lib/quiz/detail'
import { quizItemOf, quizItems } from '~~/server/lib/data/quiz-items'
import type { StaffQuizDetail } from '#shared/types/quiz'

export default defineEventHandler(async (event): Promise<StaffQuizDetail> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id, itemId } = paramsAs(event, quizItemParams)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  assertManagesQuiz(user, quiz)
  await quizItemOf(db, id, itemId)
  await assertUnlocked(db, id)
  await db.transaction().execute(async (trx) => {
    await trx.deleteFrom('quiz_items').where('id', '=', itemId).execute()
    for (const [i, it] of (await quizItems(trx, id)).entries()) await trx.updateTable('quiz_items').set({ position: i + 1 }).where('id', '=', it.id).execute()
  })
  return staffQuizDetail(db, user, quiz)
})
