// Grade return: when a quiz's results are released (or a mark is changed after release),
// each student linked to a learning platform gets a score job per resource link bound to
// the quiz; jobs are posted through AGS and retried with back-off like the mail jobs
// (server/utils/mail.ts), and the log is visible to tutors and administrators.
import type { Kysely } from 'kysely'
import type { Database, QuizRow } from '~~/db/schema'
import { computeResults } from '~~/server/utils/quiz/results'
import type { GradeLogEntry } from '#shared/types/lti'
import { postScore } from './ags'

/** Same rule as mail: the first retry after `base` seconds, doubling, at most an hour; give up after 8 tries. */
export const MAX_GRADE_ATTEMPTS = 8
export function gradeRetryDelaySeconds(attempts: number, base: number): number {
  return Math.min(3600, base * 2 ** Math.max(0, attempts - 1))
}

/** Rounds a points figure to 2 decimals (scores are sent as numbers, AGS 2.0 §3.4.1). */
function points(n: number): number {
  return Math.round(n * 100) / 100
}

/**
 * Queues the scores of `studentIds` (all students when omitted) for every resource link
 * bound to the quiz. Only after release. A newer job supersedes an older pending one for
 * the same student and link. Returns the ids of the new jobs.
 */
export async function queueQuizGrades(db: Kysely<Database>, quiz: QuizRow, reason: 'release' | 'override' | 'resend', studentIds?: number[]): Promise<number[]> {
  if (!quiz.released_at) return []
  const links = await db.selectFrom('lti_resource_links').select(['id', 'platform_id'])
    .where('quiz_id', '=', quiz.id).where('line_item_url', 'is not', null).execute()
  if (!links.length) return []
  const { rows } = await computeResults(db, quiz)
  const wanted = studentIds ? new Set(studentIds) : null
  const now = new Date().toISOString()
  const created: number[] = []
  for (const link of links) {
    const linked = new Set((await db.selectFrom('lti_users').select('user_id').where('platform_id', '=', link.platform_id).execute()).map(r => r.user_id))
    for (const row of rows) {
      if (!linked.has(row.studentId) || (wanted && !wanted.has(row.studentId))) continue
      await db.updateTable('lti_grade_jobs').set({ status: 'superseded' })
        .where('resource_link_id', '=', link.id).where('student_id', '=', row.studentId).where('status', '=', 'pending').execute()
      const job = await db.insertInto('lti_grade_jobs').values({
        quiz_id: quiz.id,
        student_id: row.studentId,
        resource_link_id: link.id,
        score_given: points(row.earned),
        score_maximum: points(row.possible),
        reason,
        status: 'pending',
        attempts: 0,
        last_error: null,
        next_attempt_at: now,
        created_at: now,
        sent_at: null,
      }).returning('id').executeTakeFirstOrThrow()
      created.push(job.id)
    }
  }
  return created
}

/** Tries one job; on failure records the error and when to try again. */
export async function deliverGradeJob(db: Kysely<Database>, jobId: number, retryBaseSeconds: number): Promise<boolean> {
  const job = await db.selectFrom('lti_grade_jobs').selectAll().where('id', '=', jobId).where('status', '=', 'pending').executeTakeFirst()
  if (!job) return false
  const attempts = job.attempts + 1
  try {
    const link = await db.selectFrom('lti_resource_links').selectAll().where('id', '=', job.resource_link_id).executeTakeFirstOrThrow()
    const platform = await db.selectFrom('lti_platforms').selectAll().where('id', '=', link.platform_id).executeTakeFirstOrThrow()
    if (platform.disabled) throw new Error('The learning platform is disabled in Cyclodial.')
    const person = await db.selectFrom('lti_users').select('subject').where('platform_id', '=', platform.id).where('user_id', '=', job.student_id).executeTakeFirstOrThrow()
    await postScore(db, platform, link.line_item_url!, { userId: person.subject, scoreGiven: job.score_given, scoreMaximum: job.score_maximum })
    await db.updateTable('lti_grade_jobs').set({ status: 'sent', attempts, sent_at: new Date().toISOString(), last_error: null }).where('id', '=', jobId).execute()
    return true
  }
  catch (error) {
    const message = (error instanceof Error ? error.message : String(error)).slice(0, 500)
    console.warn(`[lti] grade job ${jobId} failed (attempt ${attempts}): ${message}`)
    await db.updateTable('lti_grade_jobs').set({
      status: attempts >= MAX_GRADE_ATTEMPTS ? 'failed' : 'pending',
      attempts,
      last_error: message,
      next_attempt_at: new Date(Date.now() + 1000 * gradeRetryDelaySeconds(attempts, retryBaseSeconds)).toISOString(),
    }).where('id', '=', jobId).where('status', '=', 'pending').execute()
    return false
  }
}

let running: Promise<number> | null = null

/** Posts every pending job that is due (one run at a time). Returns how many were sent. */
export function deliverDueGrades(db: Kysely<Database>, retryBaseSeconds: number): Promise<number> {
  running ??= (async () => {
    let sent = 0
    try {
      const due = await db.selectFrom('lti_grade_jobs').select('id').where('status', '=', 'pending').where('next_attempt_at', '<=', new Date().toISOString()).orderBy('id').limit(100).execute()
      for (const { id } of due) if (await deliverGradeJob(db, id, retryBaseSeconds)) sent++
    }
    finally {
      running = null
    }
    return sent
  })()
  return running
}

/** The log, newest first: one quiz (limited to `studentIds` when given) or every quiz. */
export async function gradeLog(db: Kysely<Database>, filter: { quizId?: number, studentIds?: number[] }, limit = 200): Promise<GradeLogEntry[]> {
  if (filter.studentIds && !filter.studentIds.length) return []
  let q = db.selectFrom('lti_grade_jobs')
    .innerJoin('users', 'users.id', 'lti_grade_jobs.student_id')
    .innerJoin('quizzes', 'quizzes.id', 'lti_grade_jobs.quiz_id')
    .innerJoin('lti_resource_links', 'lti_resource_links.id', 'lti_grade_jobs.resource_link_id')
    .innerJoin('lti_platforms', 'lti_platforms.id', 'lti_resource_links.platform_id')
    .select([
      'lti_grade_jobs.id', 'lti_grade_jobs.quiz_id', 'quizzes.title', 'lti_grade_jobs.student_id', 'users.name', 'lti_platforms.name as platformName',
      'lti_grade_jobs.score_given', 'lti_grade_jobs.score_maximum', 'lti_grade_jobs.reason', 'lti_grade_jobs.status', 'lti_grade_jobs.attempts',
      'lti_grade_jobs.last_error', 'lti_grade_jobs.next_attempt_at', 'lti_grade_jobs.created_at', 'lti_grade_jobs.sent_at',
    ])
  if (filter.quizId) q = q.where('lti_grade_jobs.quiz_id', '=', filter.quizId)
  if (filter.studentIds) q = q.where('lti_grade_jobs.student_id', 'in', filter.studentIds)
  const rows = await q.orderBy('lti_grade_jobs.id', 'desc').limit(limit).execute()
  return rows.map(r => ({
    id: r.id,
    quizId: r.quiz_id,
    quizTitle: r.title,
    studentId: r.student_id,
    studentName: r.name,
    platformName: r.platformName,
    scoreGiven: r.score_given,
    scoreMaximum: r.score_maximum,
    reason: r.reason,
    status: r.status,
    attempts: r.attempts,
    lastError: r.last_error,
    nextAttemptAt: r.status === 'pending' ? r.next_attempt_at : null,
    createdAt: r.created_at,
    sentAt: r.sent_at,
  }))
}
