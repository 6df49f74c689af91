// Repository functions for `quiz_items`: each takes `db` (or a transaction) first.
// New SQL on this table goes here, not into handlers.
import type { Kysely, Transaction } from 'kysely'
import { createError } from 'h3'
import type { Database, QuizItemRow } from '~~/db/schema'

type Db = Kysely<Database> | Transaction<Database>

/** One item by id (it must exist: callers reach it through a row that names it). */
export function quizItem(db: Db, id: number): Promise<QuizItemRow> {
  return db.selectFrom('quiz_items').selectAll().where('id', '=', id).executeTakeFirstOrThrow()
}

/** A quiz's items in their order. */
export function quizItems(db: Db, quizId: number): Promise<QuizItemRow[]> {
  return db.selectFrom('quiz_items').selectAll().where('quiz_id', '=', quizId).orderBy('position').execute()
}

/** One item of this quiz, or 404. */
export async function quizItemOf(db: Db, quizId: number, itemId: number): Promise<QuizItemRow> {
  const item = await db.selectFrom('quiz_items').selectAll().where('quiz_id', '=', quizId).where('id', '=', itemId).executeTakeFirst()
  if (!item) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'That quiz item was not found.', data: { code: 'not-found' } })
  return item
}

/** How many items each of these quizzes has (quizzes without items are left out). */
export function quizItemCounts(db: Db, quizIds: number[]): Promise<{ quiz_id: number, n: number }[]> {
  return db.selectFrom('quiz_items').select(['quiz_id', eb => eb.fn.countAll<number>().as('n')]).where('quiz_id', 'in', quizIds).groupBy('quiz_id').execute()
}
