// A tutor's change to one mark of a quiz attempt, for either item kind: only the
// attempt that counts (the student's last on the item) may change, and the change
// and its audit entry are written in one transaction. Each kind names its override
// table and audit target (server/lib/quiz/item-kinds.ts): double Maddox rod attempts
// keep their overrides in quiz_mark_overrides, fundus attempts (their own table,
// their own ids) in quiz_fundus_overrides.
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'
import { deliverDueGrades, queueQuizGrades } from '~~/server/lib/lti/grades'
import { insertMarkOverride } from '~~/server/lib/data/mark-overrides'
import type { OverrideTable } from '~~/server/lib/data/mark-overrides'

/** 409 unless the attempt is the student's last on its item. */
export function assertCountingAttempt(attemptId: number, latestId: number): void {
  if (latestId === attemptId) return
  throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This is not the attempt that counts: the student submitted again later. Change the marks on the last attempt.', data: { code: 'not-counting-attempt' } })
}

export interface MarkOverride {
  /** The item kind's override table and audit target. */
  kind: { overrideTable: OverrideTable, auditTarget: 'attempt' | 'fundus-attempt' }
  attemptId: number
  quizId: number
  studentId: number
  itemId: number | null
  criterion: string
  from: number
  to: number
  reason: string
  actorId: number
}

export async function storeMarkOverride(db: Kysely<Database>, o: MarkOverride): Promise<void> {
  const row = { quiz_id: o.quizId, criterion: o.criterion, previous_score: o.from, score: o.to, reason: o.reason, actor_id: o.actorId, created_at: nowIso() }
  await db.transaction().execute(async (trx) => {
    await insertMarkOverride(trx, o.kind.overrideTable, o.attemptId, row)
    await writeAudit(trx, {
      actorId: o.actorId,
      action: 'quiz.mark-overridden',
      targetType: o.kind.auditTarget,
      targetId: o.attemptId,
      detail: { quizId: o.quizId, studentId: o.studentId, itemId: o.itemId, criterion: o.criterion, from: o.from, to: o.to, reason: o.reason },
    })
  })
  // after release, the changed score goes to any learning platform the quiz is linked to
  try {
    const quiz = await db.selectFrom('quizzes').selectAll().where('id', '=', o.quizId).executeTakeFirst()
    if (quiz?.released_at && (await queueQuizGrades(db, quiz, 'override', [o.studentId])).length) {
      deliverDueGrades(db, Number(useRuntimeConfig().mailRetrySeconds) || 30).catch(() => {})
    }
  }
  catch (error) {
    console.error(`[lti] could not queue the changed score of quiz ${o.quizId}: ${error instanceof Error ? error.message : error}`)
  }
}
