// POST /api/quizzes/:id/items/:itemId/turns (student): patient-turns: as for practice
// (`409` on a fundus item)
import type { PatientTurnsResult } from '#shared/engine/presentation'
import { turnRequestSchema } from '#shared/schemas/practice'
import { quizItemParams } from '#shared/schemas/quiz'
import { quizForStudent } from '~~/server/lib/quiz/access'
import { readItemConfig } from '~~/server/lib/quiz/items'
import { quizCaseRow, sittingOf } from '~~/server/lib/quiz/sitting'
import { assertSittingOpen } from '~~/server/lib/quiz/timing'
import { recordTurn } from '~~/server/lib/practice/cases'
import { withCaseErrors } from '~~/server/lib/practice/http'
import { quizItemOf } from '~~/server/lib/data/quiz-items'

// Patient-turns: the patient turns the rods (stored as a numbered trial, exactly as
// in practice, so the attempt can name the trial it read).
export default defineEventHandler(async (event): Promise<PatientTurnsResult> => {
  const user = await requireRole(event, 'student')
  const { id, itemId } = paramsAs(event, quizItemParams)
  const setting = await readBodyAs(event, turnRequestSchema)
  const db = await useDb()
  const quiz = await quizForStudent(db, user, id)
  const item = await quizItemOf(db, id, itemId)
  if (readItemConfig(item).kind !== 'dmr') {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This is a fundus item: there is no patient to turn the rods.', data: { code: 'wrong-item-kind' } })
  }
  assertSittingOpen(quiz, await sittingOf(db, id, user.id))
  const row = await quizCaseRow(db, id, itemId, user.id)
  if (!row) notFound('That quiz item')
  return withCaseErrors(() => recordTurn(db, row, setting))
})
