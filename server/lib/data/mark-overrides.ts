// Repository functions for a tutor's mark overrides: `quiz_mark_overrides` (on
// `attempts`, column `attempt_id`) and `quiz_fundus_overrides` (on
// `fundus_attempts`, column `fundus_attempt_id`), the same shape otherwise. Each
// takes `db` (or a transaction) first; which table is the item kind's choice
// (server/lib/quiz/item-kinds.ts).
import type { Kysely, Transaction } from 'kysely'
import type { Database } from '~~/db/schema'

type Db = Kysely<Database> | Transaction<Database>

/** The override tables, one per attempt table. */
export type OverrideTable = 'quiz_mark_overrides' | 'quiz_fundus_overrides'

/** A tutor's override of one mark, with who made it (results, feedback and the audit read these). */
export interface OverrideRow { attempt_id: number, criterion: string, previous_score: number, score: number, reason: string, created_at: string, actorName: string | null }

/** Every override on a quiz's attempts in one table, with the name of who made it. */
export function markOverridesOf(db: Db, table: OverrideTable, quizId: number): Promise<OverrideRow[]> {
  const q = db.selectFrom(`${table} as o` as 'quiz_mark_overrides as o').leftJoin('users', 'users.id', 'o.actor_id')
  const attemptColumn = table === 'quiz_fundus_overrides' ? 'o.fundus_attempt_id as attempt_id' : 'o.attempt_id'
  // the column that names the attempt differs; the rest are the same in both tables
  return q.select([attemptColumn as 'o.attempt_id', 'o.criterion', 'o.previous_score', 'o.score', 'o.reason', 'o.created_at', 'users.name as actorName'])
    .where('o.quiz_id', '=', quizId)
    .execute()
}

/** The columns of a new override (the attempt is named separately). */
export interface NewOverride { quiz_id: number, criterion: string, previous_score: number, score: number, reason: string, actor_id: number, created_at: string }

export async function insertMarkOverride(db: Db, table: OverrideTable, attemptId: number, row: NewOverride): Promise<void> {
  if (table === 'quiz_fundus_overrides') await db.insertInto('quiz_fundus_overrides').values({ ...row, fundus_attempt_id: attemptId }).execute()
  else await db.insertInto('quiz_mark_overrides').values({ ...row, attempt_id: attemptId }).execute()
}
