// Changing a quiz's settings (PATCH /api/quizzes/:id): the checks that depend on the
// quiz's state (times, release, started sittings, publishing needs), the tutor's reach
// over cohorts, and the update with its audit entry and moved deadlines in one transaction.
import type { Kysely, Updateable } from 'kysely'
import type { z } from 'zod'
import { createError } from 'h3'
import type { SessionUserData } from '#shared/auth/roles'
import type { quizPatchBody } from '#shared/schemas/quiz'
import type { Database, QuizRow, QuizzesTable } from '~~/db/schema'
import { writeAudit } from '~~/server/utils/audit'
import { nowIso } from '~~/server/utils/clock'
import { badRequest } from '~~/server/utils/validate'
import { assignableCohortIds, quizCohortIds } from './access'
import { quizLocked } from './detail'
import { sittingDeadline } from './timing'
import { quizItems } from '~~/server/lib/data/quiz-items'

export type QuizPatch = z.output<typeof quizPatchBody>

/** Applies a validated change to a quiz the caller manages; 400/409 name the field. */
export async function updateQuiz(db: Kysely<Database>, user: SessionUserData, quiz: QuizRow, body: QuizPatch): Promise<void> {
  const id = quiz.id
  const locked = await quizLocked(db, id)

  const next = {
    opensAt: body.opensAt !== undefined ? body.opensAt : quiz.opens_at,
    closesAt: body.closesAt !== undefined ? body.closesAt : quiz.closes_at,
  }
  if (next.opensAt && next.closesAt && Date.parse(next.closesAt) <= Date.parse(next.opensAt)) {
    badRequest([{ path: 'closesAt', message: 'The quiz must close after it opens.' }])
  }
  // released means final: the close time may come forward, never move later (or go)
  if (quiz.released_at && body.closesAt !== undefined && quiz.closes_at !== body.closesAt
    && (body.closesAt === null || !quiz.closes_at || Date.parse(body.closesAt) > Date.parse(quiz.closes_at))) {
    throw createError({
      statusCode: 409,
      statusMessage: 'Conflict',
      message: 'The results of this quiz have been released, so its close time can no longer be moved later. Duplicate the quiz to set it again.',
      data: { code: 'quiz-released', fields: [{ path: 'closesAt', message: 'Fixed once the results are released; it may only come forward.' }] },
    })
  }
  if (locked && body.interpretation !== undefined && body.interpretation !== (quiz.interpretation === 1)) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'Students have started this quiz, so the interpretation step can no longer be switched. Duplicate it instead.', data: { code: 'quiz-locked', fields: [{ path: 'interpretation', message: 'Fixed once students have started.' }] } })
  }

  // a tutor changes only the cohorts they teach; other cohorts stay assigned
  let cohortIds: number[] | undefined
  let previousCohorts: number[] = []
  if (body.cohortIds) {
    const assignable = await assignableCohortIds(db, user)
    const refused = body.cohortIds.filter(c => !assignable.includes(c))
    if (refused.length) badRequest([{ path: 'cohortIds', message: `You cannot assign cohort(s) ${refused.join(', ')}: assign only cohorts you teach.` }])
    const current = await quizCohortIds(db, id)
    previousCohorts = current
    cohortIds = [...new Set([...current.filter(c => !assignable.includes(c)), ...body.cohortIds])]
  }

  if (body.published === true && !quiz.published_at) {
    const itemCount = await quizItems(db, id)
    const problems: { path: string, message: string }[] = []
    if (!itemCount.length) problems.push({ path: 'published', message: 'Add at least one item before publishing.' })
    if (!(cohortIds ?? await quizCohortIds(db, id)).length) problems.push({ path: 'cohortIds', message: 'Assign at least one cohort before publishing.' })
    if (!next.opensAt) problems.push({ path: 'opensAt', message: 'Set when the quiz opens before publishing.' })
    if (!next.closesAt) problems.push({ path: 'closesAt', message: 'Set when the quiz closes before publishing.' })
    if (problems.length) badRequest(problems, 'quiz-incomplete')
  }
  if (body.published === false && quiz.published_at && locked) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'Students have started this quiz, so it cannot be withdrawn. Change its close time instead.', data: { code: 'quiz-locked' } })
  }

  const now = nowIso()
  const set: Updateable<QuizzesTable> = { updated_at: now }
  if (body.title !== undefined) set.title = body.title
  if (body.instructions !== undefined) set.instructions = body.instructions
  if (body.timeLimitMinutes !== undefined) set.time_limit_minutes = body.timeLimitMinutes
  if (body.opensAt !== undefined) set.opens_at = body.opensAt
  if (body.closesAt !== undefined) set.closes_at = body.closesAt
  if (body.attemptsAllowed !== undefined) set.attempts_allowed = body.attemptsAllowed
  if (body.interpretation !== undefined) set.interpretation = body.interpretation ? 1 : 0
  if (body.holdFeedback !== undefined) set.hold_feedback = body.holdFeedback ? 1 : 0
  if (body.published !== undefined) set.published_at = body.published ? (quiz.published_at ?? now) : null
  if (body.archived !== undefined) set.archived_at = body.archived ? (quiz.archived_at ?? now) : null

  await db.transaction().execute(async (trx) => {
    const updated = await trx.updateTable('quizzes').set(set).where('id', '=', id).returningAll().executeTakeFirstOrThrow()
    if (cohortIds) {
      await trx.deleteFrom('quiz_cohorts').where('quiz_id', '=', id).execute()
      for (const c of cohortIds) await trx.insertInto('quiz_cohorts').values({ quiz_id: id, cohort_id: c, created_at: now }).execute()
    }
    // a changed time limit or close time moves the deadline of every sitting still running
    if (body.timeLimitMinutes !== undefined || body.closesAt !== undefined) {
      const running = await trx.selectFrom('quiz_sittings').selectAll().where('quiz_id', '=', id).where('finished_at', 'is', null).execute()
      for (const s of running) {
        await trx.updateTable('quiz_sittings').set({ deadline_at: sittingDeadline(updated, s.started_at) }).where('id', '=', s.id).execute()
      }
    }
    const { updated_at: _u, ...changed } = set
    // the values before, field by field, so the audit log can say old → new
    const previous = Object.fromEntries(Object.keys(changed).map(k => [k, quiz[k as keyof typeof quiz] ?? null]))
    await writeAudit(trx, { actorId: user.id, action: 'quiz.updated', targetType: 'quiz', targetId: id, detail: { ...changed, ...(cohortIds ? { cohortIds, previousCohortIds: previousCohorts } : {}), previous } })
  })
}
