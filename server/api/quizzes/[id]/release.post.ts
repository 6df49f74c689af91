// POST /api/quizzes/:id/release (owner, lecturer, admin (another tutor `403`)): after
// the close time: opens feedback and e-mails every student of the cohorts; `409` while
// open. Released means final: no new sittings, saves or submissions (`409`), and the
// close time cannot move later; scores go to any linked learning platform
import { idParam } from '#shared/schemas/common'
import { QUIZ_STAFF } from '#shared/auth/roles'
import { assertManagesQuiz, quizForStaff, quizStudents } from '~~/server/lib/quiz/access'
import { quizPhase } from '~~/server/lib/quiz/timing'
import { deliverDueGrades, queueQuizGrades } from '~~/server/lib/lti/grades'
import type { QuizReleased } from '#shared/types/quiz'

// Release results: unlocks every student's feedback and e-mails each of them. Only
// after the quiz has closed, so nobody still sitting it can see an answer.
export default defineEventHandler(async (event): Promise<QuizReleased> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id } = paramsAs(event, idParam)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  assertManagesQuiz(user, quiz)
  if (quiz.released_at) {
    return { releasedAt: quiz.released_at, mailed: 0, message: 'The results were already released.' }
  }
  const phase = quizPhase(quiz)
  if (phase !== 'closed') {
    throw createError({
      statusCode: 409,
      statusMessage: 'Conflict',
      message: phase === 'open'
        ? 'The quiz is still open: release the results after it closes (or bring the close time forward).'
        : 'The quiz has not been sat yet: release the results after it closes.',
      data: { code: 'quiz-not-closed' },
    })
  }
  const now = nowIso()
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('quizzes').set({ released_at: now, released_by: user.id, updated_at: now }).where('id', '=', id).execute()
    await writeAudit(trx, { actorId: user.id, action: 'quiz.released', targetType: 'quiz', targetId: id, detail: { title: quiz.title } })
  })
  // scores to learning platforms (LTI AGS): queued now, sent in the background with retries
  let gradeJobs: number[] = []
  try {
    gradeJobs = await queueQuizGrades(db, { ...quiz, released_at: now }, 'release')
    if (gradeJobs.length) deliverDueGrades(db, Number(useRuntimeConfig().mailRetrySeconds) || 30).catch(() => {})
  }
  catch (error) {
    // the release stands; the log shows no jobs, and the tutor can see that on the marks page
    console.error(`[lti] could not queue the scores of quiz ${id}: ${error instanceof Error ? error.message : error}`)
  }
  const students = await quizStudents(db, id)
  const sat = new Set((await db.selectFrom('quiz_sittings').select('student_id').where('quiz_id', '=', id).execute()).map(s => s.student_id))
  const link = `${siteOrigin(event)}/student/quizzes/${id}`
  const fundusItems = await db.selectFrom('quiz_items').select('position').where('quiz_id', '=', id).where('kind', '=', 'fundus').orderBy('position').execute()
  const fundusLine = fundusItems.length
    ? `Fundus item${fundusItems.length === 1 ? '' : 's'} ${fundusItems.map(i => i.position).join(', ')}: your disc–fovea angle beside the picture's, your objective finding against the normal range, and where the disc centre and fovea lie.`
    : null
  let mailed = 0
  for (const s of students) {
    const { sent } = await sendMail({
      to: s.email,
      subject: `Results released: ${quiz.title}`,
      text: [
        `Hello ${s.name},`,
        '',
        sat.has(s.id)
          ? `Your tutor has released the results of “${quiz.title}”. Your marks, the slips in each record and the worked answers are ready:`
          : `Your tutor has released the results of “${quiz.title}”. You did not sit it; the worked answers are ready to review:`,
        ...(fundusLine ? [fundusLine] : []),
        link,
        '',
        'Cyclodial is a simulation for education; real assessment follows local protocols under licensed clinical supervision.',
      ].join('\n'),
    })
    if (sent) mailed++
  }
  return { releasedAt: now, mailed, gradesQueued: gradeJobs.length, message: `Results released; ${students.length} student${students.length === 1 ? '' : 's'} e-mailed.` }
})
