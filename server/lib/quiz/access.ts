// Who may see and manage which quiz. Lecturers and admins: every quiz. Tutors:
// the quizzes they own and those assigned to a cohort they teach. Students: the
// published, unarchived quizzes assigned to their cohort. Anyone else gets 404,
// so a quiz's existence is not given away.
import { createError } from 'h3'
import type { Kysely } from 'kysely'
import type { SessionUserData } from '#shared/auth/roles'
import type { Database, QuizRow } from '~~/db/schema'

export async function cohortIdsOfUser(db: Kysely<Database>, userId: number): Promise<number[]> {
  const rows = await db.selectFrom('cohort_members').select('cohort_id').where('user_id', '=', userId).execute()
  return rows.map(r => r.cohort_id)
}

export async function quizCohortIds(db: Kysely<Database>, quizId: number): Promise<number[]> {
  const rows = await db.selectFrom('quiz_cohorts').select('cohort_id').where('quiz_id', '=', quizId).execute()
  return rows.map(r => r.cohort_id)
}

function quizNotFound(): never {
  throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'That quiz was not found.', data: { code: 'not-found' } })
}

/** The quiz, if this member of staff may manage it; 404 otherwise. */
export async function quizForStaff(db: Kysely<Database>, user: SessionUserData, quizId: number): Promise<QuizRow> {
  const quiz = await db.selectFrom('quizzes').selectAll().where('id', '=', quizId).executeTakeFirst()
  if (!quiz) quizNotFound()
  if (user.role === 'lecturer' || user.role === 'admin') return quiz
  if (user.role !== 'tutor') quizNotFound()
  if (quiz.owner_id === user.id) return quiz
  const mine = await cohortIdsOfUser(db, user.id)
  const assigned = await quizCohortIds(db, quiz.id)
  if (assigned.some(id => mine.includes(id))) return quiz
  quizNotFound()
}

/** The quiz, if it is published and assigned to this student's cohort; 404 otherwise. */
export async function quizForStudent(db: Kysely<Database>, user: SessionUserData, quizId: number): Promise<QuizRow> {
  const quiz = await db.selectFrom('quizzes').selectAll()
    .where('id', '=', quizId)
    .where('published_at', 'is not', null)
    .where('archived_at', 'is', null)
    .where('id', 'in', eb => eb.selectFrom('quiz_cohorts')
      .innerJoin('cohort_members', 'cohort_members.cohort_id', 'quiz_cohorts.cohort_id')
      .select('quiz_cohorts.quiz_id')
      .where('cohort_members.user_id', '=', user.id))
    .executeTakeFirst()
  if (!quiz) quizNotFound()
  return quiz
}

/** Ids of the quizzes a caller may see in lists. */
export async function visibleQuizIds(db: Kysely<Database>, user: SessionUserData): Promise<number[] | 'all'> {
  if (user.role === 'lecturer' || user.role === 'admin') return 'all'
  const cohorts = await cohortIdsOfUser(db, user.id)
  if (user.role === 'tutor') {
    const rows = await db.selectFrom('quizzes').select('id')
      .where(eb => eb.or([
        eb('owner_id', '=', user.id),
        ...(cohorts.length ? [eb('id', 'in', eb.selectFrom('quiz_cohorts').select('quiz_id').where('cohort_id', 'in', cohorts))] : []),
      ]))
      .execute()
    return rows.map(r => r.id)
  }
  if (!cohorts.length) return []
  const rows = await db.selectFrom('quizzes').select('id')
    .where('published_at', 'is not', null)
    .where('archived_at', 'is', null)
    .where('id', 'in', eb => eb.selectFrom('quiz_cohorts').select('quiz_id').where('cohort_id', 'in', cohorts))
    .execute()
  return rows.map(r => r.id)
}

/** Cohort ids a member of staff may assign: a tutor's own cohorts; lecturers and admins any. */
export async function assignableCohortIds(db: Kysely<Database>, user: SessionUserData): Promise<number[]> {
  if (user.role === 'tutor') return cohortIdsOfUser(db, user.id)
  const rows = await db.selectFrom('cohorts').select('id').execute()
  return rows.map(r => r.id)
}

/**
 * Quiz-wide settings (times, items, publishing, archiving, release) belong to the
 * quiz's owner, lecturers and administrators. A tutor who reaches the quiz only
 * through a cohort they teach gets 403 with a message.
 */
export function managesQuiz(user: SessionUserData, quiz: Pick<QuizRow, 'owner_id'>): boolean {
  return user.role === 'lecturer' || user.role === 'admin' || quiz.owner_id === user.id
}

export function assertManagesQuiz(user: SessionUserData, quiz: Pick<QuizRow, 'owner_id'>): void {
  if (managesQuiz(user, quiz)) return
  throw createError({
    statusCode: 403,
    statusMessage: 'Forbidden',
    message: 'Only the quiz’s owner, a lecturer or an administrator can change its settings, items, publishing or release. You can see and mark the students of your own cohorts.',
    data: { code: 'not-quiz-owner' },
  })
}

/** Which cohorts' students a member of staff reaches on a quiz: lecturers and admins all; a tutor the assigned cohorts they teach (owner or not). */
export async function quizReach(db: Kysely<Database>, user: SessionUserData, quizId: number): Promise<number[] | 'all'> {
  if (user.role === 'lecturer' || user.role === 'admin') return 'all'
  const [mine, assigned] = await Promise.all([cohortIdsOfUser(db, user.id), quizCohortIds(db, quizId)])
  return assigned.filter(id => mine.includes(id))
}

/** 404 unless the student is one of the quiz's students within the caller's reach (so other cohorts' students are not given away). */
export async function assertStudentInReach(db: Kysely<Database>, user: SessionUserData, quizId: number, studentId: number): Promise<void> {
  if (user.role === 'student') return
  const reach = await quizReach(db, user, quizId)
  if (reach === 'all') return
  const hit = reach.length
    ? await db.selectFrom('cohort_members').select('user_id').where('user_id', '=', studentId).where('cohort_id', 'in', reach).executeTakeFirst()
    : undefined
  if (!hit) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'That attempt was not found.', data: { code: 'not-found' } })
}

/** Students of the cohorts a quiz is assigned to (only those of `reach`, when given). */
export async function quizStudents(db: Kysely<Database>, quizId: number, reach: number[] | 'all' = 'all') {
  if (reach !== 'all' && !reach.length) return []
  let q = db.selectFrom('users')
    .innerJoin('cohort_members', 'cohort_members.user_id', 'users.id')
    .innerJoin('quiz_cohorts', 'quiz_cohorts.cohort_id', 'cohort_members.cohort_id')
    .innerJoin('cohorts', 'cohorts.id', 'cohort_members.cohort_id')
    .select(['users.id', 'users.name', 'users.email', 'cohorts.id as cohortId', 'cohorts.name as cohortName'])
    .where('quiz_cohorts.quiz_id', '=', quizId)
    .where('users.role', '=', 'student')
  if (reach !== 'all') q = q.where('quiz_cohorts.cohort_id', 'in', reach)
  return q.orderBy('users.name').execute()
}
