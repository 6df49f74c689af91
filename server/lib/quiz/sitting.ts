// A student's sitting: starting it stores every item's case (derived from the
// quiz seed, the item and the student), so what the student sees is fixed from
// the first moment and can be replayed by the tutor.
import type { Kysely, Transaction } from 'kysely'
import type { CaseRow, Database, QuizItemRow, QuizRow } from '~~/db/schema'
import { insertCase } from '~~/server/lib/practice/cases'
import { buildItemCase, itemHasCase, readItemConfig } from './items'

type Db = Kysely<Database> | Transaction<Database>

/** The case row for one student and item, or undefined. */
export function quizCaseRow(db: Db, quizId: number, itemId: number, studentId: number): Promise<CaseRow | undefined> {
  return db.selectFrom('cases').selectAll()
    .where('purpose', '=', 'quiz').where('quiz_id', '=', quizId).where('quiz_item_id', '=', itemId).where('owner_id', '=', studentId)
    .orderBy('id').executeTakeFirst()
}

/**
 * Stores the student's case for an item if it is not stored yet; returns the row —
 * or null for a photograph item, which has no case (its picture is the photograph).
 */
export async function ensureQuizCase(db: Db, quiz: QuizRow, item: QuizItemRow, studentId: number, now: string): Promise<CaseRow | null> {
  const config = readItemConfig(item)
  if (!itemHasCase(config)) return null
  const existing = await quizCaseRow(db, quiz.id, item.id, studentId)
  if (existing) return existing
  const built = buildItemCase(config, quiz.seed, item.id, studentId)
  // a fundus item's case is never on the bench: its mode is stored only because a case row has one
  const common = { ownerId: studentId, purpose: 'quiz' as const, mode: config.kind === 'dmr' ? config.mode : 'learner-turns' as const, readScale: config.kind === 'dmr' && config.readScale, quizId: quiz.id, quizItemId: item.id, now }
  const { row } = built.specJson
    ? await insertCase(db, { ...common, spec: JSON.parse(built.specJson), specId: built.specId })
    // the template names the condition: hidden from the student until results are open
    : await insertCase(db, { ...common, templateId: built.templateId!, seed: built.seed, templateHidden: true })
  return row
}

export async function sittingOf(db: Db, quizId: number, studentId: number) {
  return db.selectFrom('quiz_sittings').selectAll().where('quiz_id', '=', quizId).where('student_id', '=', studentId).executeTakeFirst()
}
