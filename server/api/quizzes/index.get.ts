import { quizListQuery } from '#shared/schemas/quiz'
import { visibleQuizIds } from '~~/server/utils/quiz/access'
import { staffSummaries, studentSummary } from '~~/server/utils/quiz/present'

// The quizzes the caller may see: lecturers and admins every quiz; a tutor their own
// and their cohorts'; a student the published quizzes assigned to their cohort.
export default defineEventHandler(async (event) => {
  const user = await requireSignedIn(event)
  const { archived } = queryAs(event, quizListQuery)
  const db = await useDb()
  const visible = await visibleQuizIds(db, user)
  if (visible !== 'all' && !visible.length) return { items: [] }
  let q = db.selectFrom('quizzes').selectAll()
  if (visible !== 'all') q = q.where('id', 'in', visible)
  if (user.role !== 'student') q = q.where('archived_at', archived === '1' ? 'is not' : 'is', null)
  const quizzes = await q.orderBy('opens_at', 'desc').orderBy('id', 'desc').execute()
  const now = new Date()

  if (user.role === 'student') {
    const ids = quizzes.map(x => x.id)
    const [sittings, counts] = ids.length
      ? await Promise.all([
          db.selectFrom('quiz_sittings').selectAll().where('student_id', '=', user.id).where('quiz_id', 'in', ids).execute(),
          db.selectFrom('quiz_items').select(['quiz_id', eb => eb.fn.countAll<number>().as('n')]).where('quiz_id', 'in', ids).groupBy('quiz_id').execute(),
        ])
      : [[], []]
    return {
      items: quizzes.map(x => studentSummary(x, sittings.find(s => s.quiz_id === x.id), Number(counts.find(c => c.quiz_id === x.id)?.n ?? 0), now)),
    }
  }
  return { items: await staffSummaries(db, user, quizzes, now) }
})
