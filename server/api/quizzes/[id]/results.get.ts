import { idParam } from '#shared/schemas/admin'
import { resultsQuery } from '#shared/schemas/quiz'
import { quizForStaff, quizReach } from '~~/server/utils/quiz/access'
import { QUIZ_STAFF } from '~~/server/utils/quiz/staff'
import { quizSettings } from '~~/server/utils/quiz/present'
import { computeResults } from '~~/server/utils/quiz/results'
import { resultsPage } from '~~/server/utils/quiz/results-page'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id } = paramsAs(event, idParam)
  const query = queryAs(event, resultsQuery)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  const { columns, rows } = await computeResults(db, quiz, new Date(), await quizReach(db, user, id))
  return { quiz: quizSettings(quiz), ...resultsPage(columns, rows, query) }
})
