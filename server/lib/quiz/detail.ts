// One quiz as its managers see it: settings, cohorts, items and whether the
// items are locked (a student has started).
import { createError } from 'h3'
import type { Kysely } from 'kysely'
import type { SessionUserData } from '#shared/auth/roles'
import type { StaffQuizDetail } from '#shared/types/quiz'
import type { Database, QuizRow } from '~~/db/schema'
import { assignableCohortIds } from './access'
import { itemSummaryForStaff } from './items'
import { staffSummaries } from './present'
import { quizItems } from '~~/server/lib/data/quiz-items'

export async function quizLocked(db: Kysely<Database>, quizId: number): Promise<boolean> {
  const started = await db.selectFrom('quiz_sittings').select('id').where('quiz_id', '=', quizId).limit(1).executeTakeFirst()
  return !!started
}

export async function staffQuizDetail(db: Kysely<Database>, user: SessionUserData, quiz: QuizRow): Promise<StaffQuizDetail> {
  const [[summary], items, locked, assignable] = await Promise.all([
    staffSummaries(db, user, [quiz]),
    quizItems(db, quiz.id),
    quizLocked(db, quiz.id),
    assignableCohortIds(db, user),
  ])
  const cohorts = assignable.length
    ? await db.selectFrom('cohorts').select(['id', 'name']).where('id', 'in', assignable).orderBy('name').execute()
    : []
  return { ...summary!, items: items.map(itemSummaryForStaff), locked, assignableCohorts: cohorts }
}

/** 409 when the quiz's items may no longer change. */
export async function assertUnlocked(db: Kysely<Database>, quizId: number): Promise<void> {
  if (await quizLocked(db, quizId)) {
    throw createError({
      statusCode: 409,
      statusMessage: 'Conflict',
      message: 'Students have started this quiz, so its items and marking can no longer change. Duplicate it to make a changed version.',
      data: { code: 'quiz-locked' },
    })
  }
}
