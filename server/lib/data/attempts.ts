// Repository functions for the two attempt tables (`attempts`: double Maddox rod,
// `fundus_attempts`): each takes `db` (or a transaction) first. New SQL on these
// tables goes here, not into handlers.
import type { Kysely, Transaction } from 'kysely'
import type { Database } from '~~/db/schema'

type Db = Kysely<Database> | Transaction<Database>

/** Which student's attempts on which quiz item. */
export interface QuizItemAttemptKey { quizId: number, itemId: number | null, learnerId: number }

/** The attempt that counts: the student's last double Maddox rod attempt on the item. */
export function countingAttempt(db: Db, key: QuizItemAttemptKey): Promise<{ id: number }> {
  return db.selectFrom('attempts').select('id')
    .where('quiz_id', '=', key.quizId).where('quiz_item_id', '=', key.itemId).where('learner_id', '=', key.learnerId).where('kind', '=', 'quiz')
    .orderBy('id', 'desc').executeTakeFirstOrThrow()
}

/** The attempt that counts on a fundus item: the student's last one. */
export function countingFundusAttempt(db: Db, key: QuizItemAttemptKey): Promise<{ id: number }> {
  return db.selectFrom('fundus_attempts').select('id')
    .where('quiz_id', '=', key.quizId).where('quiz_item_id', '=', key.itemId).where('learner_id', '=', key.learnerId).where('kind', '=', 'quiz')
    .orderBy('id', 'desc').executeTakeFirstOrThrow()
}
