// Repository functions for a student's unsubmitted work on quiz items: a double
// Maddox rod item's draft is its case row's `draft_json`, a fundus item's a
// `quiz_fundus_drafts` row. Each takes `db` (or a transaction) first.
import type { Kysely, Transaction } from 'kysely'
import type { Database } from '~~/db/schema'

type Db = Kysely<Database> | Transaction<Database>

/** Who has a saved draft on which item. */
export interface DraftOwner { owner_id: number | null, quiz_item_id: number | null }

/** Students' saved benches on a quiz's double Maddox rod items (one student's when `studentId` is given). */
export function benchDraftsOf(db: Db, quizId: number, studentId?: number): Promise<DraftOwner[]> {
  let q = db.selectFrom('cases').select(['owner_id', 'quiz_item_id']).where('quiz_id', '=', quizId)
  if (studentId !== undefined) q = q.where('owner_id', '=', studentId)
  return q.where('purpose', '=', 'quiz').where('draft_json', 'is not', null).execute()
}

/** Students' saved marks on a quiz's fundus items (one student's when `studentId` is given). */
export function fundusDraftsOf(db: Db, quizId: number, studentId?: number): Promise<DraftOwner[]> {
  let q = db.selectFrom('quiz_fundus_drafts').select(['student_id as owner_id', 'quiz_item_id']).where('quiz_id', '=', quizId)
  if (studentId !== undefined) q = q.where('student_id', '=', studentId)
  return q.execute()
}
