// GET /api/quizzes/cohorts (tutor, lecturer, admin): the cohorts the caller may assign
import { QUIZ_STAFF } from '#shared/auth/roles'
import type { CohortChoice } from '#shared/types/quiz'
import { assignableCohortIds } from '~~/server/lib/quiz/access'

// The cohorts the caller may assign a quiz (or a roster) to: a tutor's own; lecturers and admins all.
export default defineEventHandler(async (event): Promise<CohortChoice[]> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const db = await useDb()
  const ids = await assignableCohortIds(db, user)
  if (!ids.length) return []
  return db.selectFrom('cohorts').select(['id', 'name']).where('id', 'in', ids).orderBy('name').execute()
})
