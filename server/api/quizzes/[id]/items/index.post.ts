// POST /api/quizzes/:id/items (owner, lecturer, admin; another tutor 403): add an item,
// `{ kind: 'dmr' | 'fundus', … }` (shared/schemas/quiz.ts quizItemBody).
import { idParam } from '#shared/schemas/common'
import { QUIZ_STAFF } from '#shared/auth/roles'
import { quizItemBody } from '#shared/schemas/quiz'
import { assertManagesQuiz, quizForStaff } from '~~/server/lib/quiz/access'
import { assertUnlocked, staffQuizDetail } from '~~/server/lib/quiz/detail'
import { itemConfigFromBody } from '~~/server/lib/quiz/items'
import type { StaffQuizDetail } from '#shared/types/quiz'

export default defineEventHandler(async (event): Promise<StaffQuizDetail> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id } = paramsAs(event, idParam)
  const body = await readBodyAs(event, quizItemBody)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  assertManagesQuiz(user, quiz)
  await assertUnlocked(db, id)
  const config = await itemConfigFromBody(db, user, body)
  const last = await db.selectFrom('quiz_items').select(eb => eb.fn.max<number>('position').as('p')).where('quiz_id', '=', id).executeTakeFirst()
  const now = nowIso()
  await db.insertInto('quiz_items').values({
    quiz_id: id,
    position: Number(last?.p ?? 0) + 1,
    kind: config.kind,
    prompt: body.prompt ?? '',
    config_json: JSON.stringify(config),
    created_at: now,
    updated_at: now,
  }).execute()
  await db.updateTable('quizzes').set({ updated_at: now }).where('id', '=', id).execute()
  setResponseStatus(event, 201)
  return staffQuizDetail(db, user, quiz)
})
