// GET /api/quizzes/:id/results (manager (a tutor: their cohorts' students only)):
// `?q&cohortId&status&sort=name\|total\|slips\|time\|status\|item-<id>&dir&page&pageSize`
// → `{ quiz, columns, items: [{ studentId, name, status, items: { [itemId]: { attemptId,
// earned, possible, marks, slips, overridden } }, earned, possible, score, slips,
// timeTakenMs }], total, page, pageSize, summary: { students, started, finished,
// meanScore /* those who finished; null while nobody has */ }, release: { students,
// neverSat } \| null /* what releasing would e-mail; for whoever may release, before
// release */ }`
import { idParam } from '#shared/schemas/common'
import { QUIZ_STAFF } from '#shared/auth/roles'
import { resultsQuery } from '#shared/schemas/quiz'
import type { QuizResultsResponse } from '#shared/types/quiz'
import { managesQuiz, quizForStaff, quizReach, quizStudents } from '~~/server/lib/quiz/access'
import { quizSettings } from '~~/server/lib/quiz/present'
import { computeResults } from '~~/server/lib/quiz/results'
import { resultsPage } from '~~/server/lib/quiz/results-page'

export default defineEventHandler(async (event): Promise<QuizResultsResponse> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id } = paramsAs(event, idParam)
  const query = queryAs(event, resultsQuery)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  const { columns, rows } = await computeResults(db, quiz, new Date(), await quizReach(db, user, id))
  // what releasing would do (for the confirmation): every student of the quiz's cohorts
  // is e-mailed, those who never sat it included; only whoever may release is told
  let release: { students: number, neverSat: number } | null = null
  if (managesQuiz(user, quiz) && !quiz.released_at) {
    const everyone = new Set((await quizStudents(db, id)).map(s => s.id))
    const sat = await db.selectFrom('quiz_sittings').select('student_id').where('quiz_id', '=', id).execute()
    release = { students: everyone.size, neverSat: [...everyone].filter(s => !sat.some(x => x.student_id === s)).length }
  }
  return { quiz: quizSettings(quiz), ...resultsPage(columns, rows, query), release }
})
