// GET /api/quizzes (signed in): the quizzes the caller may see — lecturers and admins
// all, a tutor their own and their cohorts', a student the published ones of their
// cohort; `?archived=1` for staff; paged, newest opening first: `?page` (from 1)
// `&pageSize` (1–100, default 50). Staff: `{ items: [{ id, title, phase, opensAt,
// closesAt, cohorts, itemCount, students, started, … }], total, page, pageSize }`;
// students: `{ items: [{ id, title, phase, opensAt, closesAt, timeLimitMinutes,
// itemCount, feedbackOpen, sitting: { status, startedAt, deadline } }], total, page,
// pageSize }`
import { quizListQuery } from '#shared/schemas/quiz'
import type { QuizPage, StaffQuizSummary, StudentQuizSummary } from '#shared/types/quiz'
import { visibleQuizIds } from '~~/server/lib/quiz/access'
import { staffSummaries, studentSummary } from '~~/server/lib/quiz/present'
import { quizItemCounts } from '~~/server/lib/data/quiz-items'

// The quizzes the caller may see: lecturers and admins every quiz; a tutor their own
// and their cohorts'; a student the published quizzes assigned to their cohort.
// Paged: `page` (from 1) and `pageSize` (default 50, at most 100), newest opening first.
export default defineEventHandler(async (event): Promise<QuizPage<StaffQuizSummary> | QuizPage<StudentQuizSummary>> => {
  const user = await requireSignedIn(event)
  const { archived, page, pageSize } = queryAs(event, quizListQuery)
  const db = await useDb()
  const visible = await visibleQuizIds(db, user)
  if (visible !== 'all' && !visible.length) return { items: [], total: 0, page, pageSize }
  let q = db.selectFrom('quizzes')
  if (visible !== 'all') q = q.where('id', 'in', visible)
  if (user.role !== 'student') q = q.where('archived_at', archived === '1' ? 'is not' : 'is', null)
  const [{ total }, quizzes] = await Promise.all([
    q.select(eb => eb.fn.countAll<number>().as('total')).executeTakeFirstOrThrow(),
    q.selectAll().orderBy('opens_at', 'desc').orderBy('id', 'desc').limit(pageSize).offset((page - 1) * pageSize).execute(),
  ])
  const paging = { total: Number(total), page, pageSize }
  const now = new Date()

  if (user.role === 'student') {
    const ids = quizzes.map(x => x.id)
    const [sittings, counts] = ids.length
      ? await Promise.all([
          db.selectFrom('quiz_sittings').selectAll().where('student_id', '=', user.id).where('quiz_id', 'in', ids).execute(),
          quizItemCounts(db, ids),
        ])
      : [[], []]
    return {
      items: quizzes.map(x => studentSummary(x, sittings.find(s => s.quiz_id === x.id), Number(counts.find(c => c.quiz_id === x.id)?.n ?? 0), now)),
      ...paging,
    }
  }
  return { items: await staffSummaries(db, user, quizzes, now), ...paging }
})
