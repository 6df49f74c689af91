// Repository functions for the two attempt tables (`attempts`: double Maddox rod,
// practice and quiz; `fundus_attempts`): each takes `db` (or a transaction) first. New SQL on these
// tables goes here, not into handlers. The quiz functions serve either table: both
// carry `id`, `quiz_id`, `quiz_item_id`, `learner_id`, `kind` and `submitted_at`,
// and only those columns are named here (which table is the item kind's choice,
// server/lib/quiz/item-kinds.ts).
import type { Kysely, Transaction } from 'kysely'
import type { AttemptRow, Database, FundusAttemptRow } from '~~/db/schema'
import type { Paging } from './paging'
import { countRows, onePage } from './paging'

type Db = Kysely<Database> | Transaction<Database>

/** The tables quiz attempts are stored in, one per item kind. */
export type AttemptTable = 'attempts' | 'fundus_attempts'
/** A row of an attempt table. */
export type AttemptRowOf<T extends AttemptTable> = T extends 'attempts' ? AttemptRow : FundusAttemptRow

/** Which student's attempts on which quiz item. */
export interface QuizItemAttemptKey { quizId: number, itemId: number | null, learnerId: number }

/** The attempt that counts: the student's last attempt on the item (in the item kind's table). */
export function countingQuizAttempt(db: Db, table: AttemptTable, key: QuizItemAttemptKey): Promise<{ id: number }> {
  // both tables have the columns named here; Kysely is told one name so the query types
  return db.selectFrom(table as 'attempts').select('id')
    .where('quiz_id', '=', key.quizId).where('quiz_item_id', '=', key.itemId).where('learner_id', '=', key.learnerId).where('kind', '=', 'quiz')
    .orderBy('id', 'desc').executeTakeFirstOrThrow()
}

/** The attempt that counts: the student's last double Maddox rod attempt on the item. */
export const countingAttempt = (db: Db, key: QuizItemAttemptKey): Promise<{ id: number }> => countingQuizAttempt(db, 'attempts', key)

/** The attempt that counts on a fundus item: the student's last one. */
export const countingFundusAttempt = (db: Db, key: QuizItemAttemptKey): Promise<{ id: number }> => countingQuizAttempt(db, 'fundus_attempts', key)

/** One quiz attempt of this quiz by id (only the learner's own when `learnerId` is given), or undefined. */
export async function quizAttemptById<T extends AttemptTable>(db: Db, table: T, key: { quizId: number, attemptId: number, learnerId?: number }): Promise<AttemptRowOf<T> | undefined> {
  let q = db.selectFrom(table as 'attempts').selectAll().where('id', '=', key.attemptId).where('quiz_id', '=', key.quizId).where('kind', '=', 'quiz')
  if (key.learnerId !== undefined) q = q.where('learner_id', '=', key.learnerId)
  return (await q.executeTakeFirst()) as AttemptRowOf<T> | undefined
}

/** Every quiz attempt on a quiz (only one learner's when `learnerId` is given), oldest first. */
export async function quizAttemptsOf<T extends AttemptTable>(db: Db, table: T, quizId: number, learnerId?: number): Promise<AttemptRowOf<T>[]> {
  let q = db.selectFrom(table as 'attempts').selectAll().where('quiz_id', '=', quizId)
  if (learnerId !== undefined) q = q.where('learner_id', '=', learnerId)
  return (await q.where('kind', '=', 'quiz').orderBy('id').execute()) as AttemptRowOf<T>[]
}

/** One student's attempts on one quiz item (id and time), oldest first. */
export function quizItemAttempts(db: Db, table: AttemptTable, key: QuizItemAttemptKey): Promise<{ id: number, submitted_at: string }[]> {
  return db.selectFrom(table as 'attempts').select(['id', 'submitted_at'])
    .where('quiz_id', '=', key.quizId).where('quiz_item_id', '=', key.itemId).where('learner_id', '=', key.learnerId).where('kind', '=', 'quiz')
    .orderBy('id').execute()
}

/** How many attempts one student has made on one quiz item. */
export async function quizItemAttemptCount(db: Db, table: AttemptTable, key: QuizItemAttemptKey): Promise<number> {
  const { n } = await db.selectFrom(table as 'attempts').select(eb => eb.fn.countAll<number>().as('n'))
    .where('quiz_id', '=', key.quizId).where('quiz_item_id', '=', key.itemId).where('learner_id', '=', key.learnerId).where('kind', '=', 'quiz')
    .executeTakeFirstOrThrow()
  return Number(n)
}

/** Whether the learner has submitted anything on this case before. */
export async function hasAttemptOnCase(db: Db, caseId: number, learnerId: number): Promise<boolean> {
  return !!(await db.selectFrom('attempts').select('id').where('case_id', '=', caseId).where('learner_id', '=', learnerId).executeTakeFirst())
}

/** The learner's practice attempts on one case, oldest first. */
export function practiceAttemptsOnCase(db: Db, caseId: number, learnerId: number): Promise<AttemptRow[]> {
  return db.selectFrom('attempts').selectAll()
    .where('case_id', '=', caseId).where('learner_id', '=', learnerId).where('kind', '=', 'practice')
    .orderBy('id').execute()
}

/** One of the learner's own practice attempts, or undefined. */
export function ownPracticeAttempt(db: Db, attemptId: number, learnerId: number): Promise<AttemptRow | undefined> {
  return db.selectFrom('attempts').selectAll()
    .where('id', '=', attemptId).where('learner_id', '=', learnerId).where('kind', '=', 'practice')
    .executeTakeFirst()
}

/** One page of the learner's practice attempts, newest first (only these engine templates when given). */
export async function practiceHistoryPage(db: Db, learnerId: number, templateIds: string[] | null, paging: Paging) {
  let base = db.selectFrom('attempts').where('learner_id', '=', learnerId).where('kind', '=', 'practice')
  if (templateIds) base = base.where('template_id', 'in', templateIds)
  const total = await countRows(base)
  const rows = await onePage(base
    .select(['id', 'case_id', 'submitted_at', 'template_id', 'truth_json', 'mode', 'score', 'slips_json'])
    .orderBy('submitted_at', 'desc').orderBy('id', 'desc'), paging)
    .execute()
  return { rows, total }
}
