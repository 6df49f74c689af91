// PATCH /api/quizzes/:id/items/:itemId (owner, lecturer, admin; another tutor 403):
// change an item (409 once the quiz is locked).
import { QUIZ_STAFF } from '#shared/auth/roles'
import { quizItemParams, quizItemPatch } from '#shared/schemas/quiz'
import { assertManagesQuiz, quizForStaff } from '~~/server/lib/quiz/access'
import { assertUnlocked, staffQuizDetail } from '~~/server/lib/quiz/detail'
import { assertWeightsOfKind, fixedSource, readItemConfig, resolveWeights, snapshotFundusSource, snapshotSource } from '~~/server/lib/quiz/items'
import { quizItemOf, quizItems } from '~~/server/lib/data/quiz-items'
import type { StaffQuizDetail } from '#shared/types/quiz'

export default defineEventHandler(async (event): Promise<StaffQuizDetail> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id, itemId } = paramsAs(event, quizItemParams)
  const body = await readBodyAs(event, quizItemPatch)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  assertManagesQuiz(user, quiz)
  const item = await quizItemOf(db, id, itemId)
  await assertUnlocked(db, id)
  const config = readItemConfig(item)
  assertWeightsOfKind(body.weights, config.kind)
  if (config.kind === 'fundus') {
    const stray = (['mode', 'readScale'] as const).filter(k => body[k] !== undefined)
    if (stray.length) badRequest(stray.map(k => ({ path: k, message: 'A fundus item has no double Maddox rod settings.' })))
    if (body.tolerance !== undefined && body.tolerance > 5) badRequest([{ path: 'tolerance', message: 'The tolerance of a fundus item is at most 5°.' }])
    if (body.source) config.source = await snapshotFundusSource(db, user, body.source)
    if (body.perStudent !== undefined) config.perStudent = body.perStudent
    if (fixedSource(config.source)) config.perStudent = false
    if (body.tolerance !== undefined) config.tolerance = body.tolerance
    if (body.weights !== undefined) config.weights = resolveWeights(body.weights, config.weights, 'fundus')
  }
  else if (body.source?.type === 'photo') {
    badRequest([{ path: 'source', message: 'A photograph is a source for fundus items only.' }])
  }
  else if (body.source) {
    const { snapshot, tolerance } = await snapshotSource(db, user, body.source)
    config.source = snapshot
    if (body.tolerance === undefined) config.tolerance = tolerance
  }
  if (config.kind === 'dmr') {
    if (body.perStudent !== undefined) config.perStudent = body.perStudent
    if (config.source.type === 'case') config.perStudent = false
    if (body.mode !== undefined) config.mode = body.mode
    if (body.readScale !== undefined) config.readScale = body.readScale
    if (body.tolerance !== undefined) config.tolerance = body.tolerance
    if (body.weights !== undefined) config.weights = resolveWeights(body.weights, config.weights)
  }
  const now = nowIso()
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('quiz_items').set({
      config_json: JSON.stringify(config),
      ...(body.prompt !== undefined ? { prompt: body.prompt } : {}),
      updated_at: now,
    }).where('id', '=', itemId).execute()
    if (body.position !== undefined && body.position !== item.position) {
      // move the item and renumber the others 1…n
      const ordered = (await quizItems(trx, id)).filter(i => i.id !== itemId)
      ordered.splice(Math.min(body.position - 1, ordered.length), 0, item)
      for (const [i, it] of ordered.entries()) await trx.updateTable('quiz_items').set({ position: i + 1 }).where('id', '=', it.id).execute()
    }
  })
  return staffQuizDetail(db, user, quiz)
})
