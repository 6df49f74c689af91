// POST /api/quizzes (tutor, lecturer, admin): `{ title, instructions?, opensAt?,
// closesAt?, timeLimitMinutes?, attemptsAllowed?, interpretation?, holdFeedback?,
// cohortIds? }` (ISO 8601 times; a tutor assigns only cohorts they teach) → `201` the
// quiz
import { QUIZ_STAFF } from '#shared/auth/roles'
import { quizCreateBody } from '#shared/schemas/quiz'
import { assignableCohortIds } from '~~/server/lib/quiz/access'
import { newQuizSeed } from '~~/server/lib/quiz/seeds'
import { staffQuizDetail } from '~~/server/lib/quiz/detail'
import type { StaffQuizDetail } from '#shared/types/quiz'

export default defineEventHandler(async (event): Promise<StaffQuizDetail> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const body = await readBodyAs(event, quizCreateBody)
  const db = await useDb()
  const assignable = await assignableCohortIds(db, user)
  const refused = body.cohortIds.filter(id => !assignable.includes(id))
  if (refused.length) badRequest([{ path: 'cohortIds', message: `You cannot assign cohort(s) ${refused.join(', ')}: assign only cohorts you teach.` }])
  const now = nowIso()
  const quiz = await db.transaction().execute(async (trx) => {
    const row = await trx.insertInto('quizzes').values({
      owner_id: user.id,
      title: body.title,
      instructions: body.instructions,
      seed: newQuizSeed(),
      time_limit_minutes: body.timeLimitMinutes,
      opens_at: body.opensAt,
      closes_at: body.closesAt,
      attempts_allowed: body.attemptsAllowed,
      interpretation: body.interpretation ? 1 : 0,
      hold_feedback: body.holdFeedback ? 1 : 0,
      published_at: null,
      released_at: null,
      released_by: null,
      archived_at: null,
      duplicated_from: null,
      created_at: now,
      updated_at: now,
    }).returningAll().executeTakeFirstOrThrow()
    for (const cohortId of body.cohortIds) {
      await trx.insertInto('quiz_cohorts').values({ quiz_id: row.id, cohort_id: cohortId, created_at: now }).execute()
    }
    await writeAudit(trx, { actorId: user.id, action: 'quiz.created', targetType: 'quiz', targetId: row.id, detail: { title: body.title, cohortIds: body.cohortIds } })
    return row
  })
  setResponseStatus(event, 201)
  return staffQuizDetail(db, user, quiz)
})
