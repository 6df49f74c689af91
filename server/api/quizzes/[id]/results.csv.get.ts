// GET /api/quizzes/:id/results.csv (tutor, lecturer, admin (manager; a tutor: their
// cohorts' students only)): `text/csv`: one row per student, a column per item and per
// criterion, slips and totals
import { idParam } from '#shared/schemas/common'
import { QUIZ_STAFF } from '#shared/auth/roles'
import { quizForStaff, quizReach } from '~~/server/lib/quiz/access'
import { resultsCsv } from '~~/server/lib/quiz/csv'
import { computeResults } from '~~/server/lib/quiz/results'

export default defineEventHandler(async (event): Promise<string> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id } = paramsAs(event, idParam)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  const { columns, rows } = await computeResults(db, quiz, new Date(), await quizReach(db, user, id))
  const slug = quiz.title.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'quiz'
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${slug}-${quiz.id}-results.csv"`)
  setResponseHeader(event, 'cache-control', 'no-store')
  return resultsCsv(columns, rows)
})
