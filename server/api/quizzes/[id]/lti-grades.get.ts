// The quiz's scores sent to learning platforms (or waiting, with the last error): a tutor
// sees their own cohorts' students.
import { idParam } from '#shared/schemas/common'
import type { QuizGradeLog } from '#shared/types/lti'
import { gradeLog } from '~~/server/lib/lti/grades'
import { quizForStaff, quizReach, quizStudents } from '~~/server/lib/quiz/access'
import { QUIZ_STAFF } from '#shared/auth/roles'

export default defineEventHandler(async (event): Promise<QuizGradeLog> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id } = paramsAs(event, idParam)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  const reach = await quizReach(db, user, id)
  const studentIds = reach === 'all' ? undefined : (await quizStudents(db, id, reach)).map(s => s.id)
  const links = await db.selectFrom('lti_resource_links').innerJoin('lti_platforms', 'lti_platforms.id', 'lti_resource_links.platform_id')
    .select(['lti_platforms.name']).where('lti_resource_links.quiz_id', '=', id).execute()
  return { quizId: quiz.id, title: quiz.title, released: !!quiz.released_at, platforms: [...new Set(links.map(l => l.name))], items: await gradeLog(db, { quizId: id, studentIds }) }
})
