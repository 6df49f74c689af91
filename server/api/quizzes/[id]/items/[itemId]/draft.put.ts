// PUT /api/quizzes/:id/items/:itemId/draft (student): the bench (as for practice), or
// for a fundus item `{ eyes: { RE?, LE?: { disc, fovea, finding } /* each may be null */
// } }` → `{ savedAt }`; `409` with a message once the deadline has passed (what was
// saved stays)
import { benchDraftSchema } from '#shared/schemas/practice'
import { fundusItemDraftBody, quizItemParams } from '#shared/schemas/quiz'
import { readItemConfig } from '~~/server/lib/quiz/items'
import { saveFundusDraft } from '~~/server/lib/quiz/fundus-sitting'
import { quizForStudent } from '~~/server/lib/quiz/access'
import { quizCaseRow, sittingOf } from '~~/server/lib/quiz/sitting'
import { assertSittingOpen } from '~~/server/lib/quiz/timing'
import { quizItemOf } from '~~/server/lib/data/quiz-items'
import type { DraftSaved } from '#shared/types/common'

// Autosave, stored on the case row as the practice API stores it. Refused (409)
// once the sitting has ended: what was saved before the deadline stays as it was.
// A fundus item's body is its marks so far ({ eyes: { RE?, LE? } }), kept per
// item and student in quiz_fundus_drafts; the item decides which body is read.
export default defineEventHandler(async (event): Promise<DraftSaved> => {
  const user = await requireRole(event, 'student')
  const { id, itemId } = paramsAs(event, quizItemParams)
  const db = await useDb()
  const quiz = await quizForStudent(db, user, id)
  const item = await quizItemOf(db, id, itemId)
  if (readItemConfig(item).kind === 'fundus') {
    const marks = await readBodyAs(event, fundusItemDraftBody)
    assertSittingOpen(quiz, await sittingOf(db, id, user.id))
    return saveFundusDraft(db, id, itemId, user.id, marks)
  }
  const draft = await readBodyAs(event, benchDraftSchema)
  assertSittingOpen(quiz, await sittingOf(db, id, user.id))
  const row = await quizCaseRow(db, id, itemId, user.id)
  if (!row) notFound('That quiz item')
  const savedAt = nowIso()
  await db.updateTable('cases').set({ draft_json: JSON.stringify({ ...draft, savedAt }), updated_at: savedAt }).where('id', '=', row.id).execute()
  return { savedAt }
})
