// POST /api/quizzes/:id/duplicate (manager): an unpublished copy with a new seed → `201`
import { idParam } from '#shared/schemas/common'
import { QUIZ_STAFF } from '#shared/auth/roles'
import { assignableCohortIds, quizCohortIds, quizForStaff } from '~~/server/lib/quiz/access'
import { staffQuizDetail } from '~~/server/lib/quiz/detail'
import { newQuizSeed } from '~~/server/lib/quiz/seeds'
import { quizItems } from '~~/server/lib/data/quiz-items'
import type { StaffQuizDetail } from '#shared/types/quiz'

// A copy keeps the settings, items and (the caller's own) cohorts, unpublished,
// with a fresh seed: new patients, so answers from the first sitting do not carry over.
export default defineEventHandler(async (event): Promise<StaffQuizDetail> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id } = paramsAs(event, idParam)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  const [items, cohorts, assignable] = await Promise.all([quizItems(db, id), quizCohortIds(db, id), assignableCohortIds(db, user)])
  const now = nowIso()
  const copy = await db.transaction().execute(async (trx) => {
    const row = await trx.insertInto('quizzes').values({
      owner_id: user.id,
      title: `Copy of ${quiz.title}`.slice(0, 120),
      instructions: quiz.instructions,
      seed: newQuizSeed(),
      time_limit_minutes: quiz.time_limit_minutes,
      opens_at: null,
      closes_at: null,
      attempts_allowed: quiz.attempts_allowed,
      interpretation: quiz.interpretation,
      hold_feedback: quiz.hold_feedback,
      published_at: null,
      released_at: null,
      released_by: null,
      archived_at: null,
      duplicated_from: quiz.id,
      created_at: now,
      updated_at: now,
    }).returningAll().executeTakeFirstOrThrow()
    for (const item of items) {
      await trx.insertInto('quiz_items').values({ quiz_id: row.id, position: item.position, kind: item.kind, prompt: item.prompt, config_json: item.config_json, created_at: now, updated_at: now }).execute()
    }
    for (const c of cohorts.filter(c => assignable.includes(c))) {
      await trx.insertInto('quiz_cohorts').values({ quiz_id: row.id, cohort_id: c, created_at: now }).execute()
    }
    await writeAudit(trx, { actorId: user.id, action: 'quiz.duplicated', targetType: 'quiz', targetId: row.id, detail: { from: quiz.id } })
    return row
  })
  setResponseStatus(event, 201)
  return staffQuizDetail(db, user, copy)
})
