// POST /api/quizzes/:id/start (student, assigned): start the sitting (fixes the
// deadline; starting twice changes nothing).
import { idParam } from '#shared/schemas/common'
import { quizForStudent } from '~~/server/lib/quiz/access'
import { studentQuizDetail } from '~~/server/lib/quiz/student'
import { quizItems } from '~~/server/lib/data/quiz-items'
import { ensureQuizCase, sittingOf } from '~~/server/lib/quiz/sitting'
import { quizPhase, sittingDeadline } from '~~/server/lib/quiz/timing'
import type { StudentQuizDetail } from '#shared/types/quiz'

// Starting stores the sitting (its deadline fixed now) and every item's case in one
// transaction. Starting again is harmless: the first start stands.
export default defineEventHandler(async (event): Promise<StudentQuizDetail> => {
  const user = await requireRole(event, 'student')
  const { id } = paramsAs(event, idParam)
  const db = await useDb()
  const quiz = await quizForStudent(db, user, id)
  const existing = await sittingOf(db, id, user.id)
  if (!existing && quiz.released_at) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'The results of this quiz have been released; it can no longer be started.', data: { code: 'quiz-released' } })
  }
  if (!existing) {
    const phase = quizPhase(quiz)
    if (phase !== 'open') {
      throw createError({
        statusCode: 409,
        statusMessage: 'Conflict',
        message: phase === 'upcoming' ? 'This quiz has not opened yet.' : 'This quiz has closed; it can no longer be started.',
        data: { code: phase === 'upcoming' ? 'quiz-not-open' : 'quiz-closed' },
      })
    }
    const now = nowIso()
    await db.transaction().execute(async (trx) => {
      // a second request racing this one finds the sitting inside the transaction
      if (await sittingOf(trx, id, user.id)) return
      await trx.insertInto('quiz_sittings').values({ quiz_id: id, student_id: user.id, started_at: now, deadline_at: sittingDeadline(quiz, now), finished_at: null }).execute()
      for (const item of await quizItems(trx, id)) await ensureQuizCase(trx, quiz, item, user.id, now)
    })
  }
  return studentQuizDetail(db, user, quiz)
})
