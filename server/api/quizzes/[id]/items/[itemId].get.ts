// GET /api/quizzes/:id/items/:itemId (student (assigned, started)): `{ kind: 'dmr',
// caseId, prompt, mode, readScale, interpretation, presentation, draft, turns, attempts:
// [{ attemptId, submittedAt }], attemptsLeft, deadline, serverNow }`, or `{ kind:
// 'fundus', prompt, eyes, presentation: null, pictures: { RE?, LE?: { imageUrl, width,
// height, eye } } /* a case's fundus as server-rendered PNGs, sized in disc diameters
// */, photo: { imageUrl, width, height, eye }, draft, attempts, attemptsLeft, deadline,
// serverNow }` — never the truth, reference marks, angle or a generated picture's disc
// and fovea coordinates
import type { StudentQuizItemPage } from '#shared/types/quiz'
import { quizItemParams } from '#shared/schemas/quiz'
import { quizForStudent } from '~~/server/lib/quiz/access'
import { readItemConfig } from '~~/server/lib/quiz/items'
import { ensureQuizCase, sittingOf } from '~~/server/lib/quiz/sitting'
import { studentFundusItem } from '~~/server/lib/quiz/fundus-sitting'
import { caseTurns, regenerateCase } from '~~/server/lib/practice/cases'
import { toPresentation } from '~~/server/lib/engine/presentation'
import { quizItemOf } from '~~/server/lib/data/quiz-items'
import { quizItemAttempts } from '~~/server/lib/data/attempts'

// One item for the bench: the presentation (never the truth), the autosaved draft and
// the patient's turns so far, so a reload or a restarted server picks up where it was.
// A fundus item gives the marker its picture(s) and the saved marks instead.
export default defineEventHandler(async (event): Promise<StudentQuizItemPage> => {
  const user = await requireRole(event, 'student')
  const { id, itemId } = paramsAs(event, quizItemParams)
  const db = await useDb()
  const quiz = await quizForStudent(db, user, id)
  const item = await quizItemOf(db, id, itemId)
  const sitting = await sittingOf(db, id, user.id)
  if (!sitting) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'Start the quiz first.', data: { code: 'quiz-not-started' } })
  }
  const config = readItemConfig(item)
  if (config.kind === 'fundus') return studentFundusItem(db, user, quiz, item, config, sitting)
  const row = (await ensureQuizCase(db, quiz, item, user.id, nowIso()))!
  const [attempts, turns] = await Promise.all([
    quizItemAttempts(db, 'attempts', { quizId: id, itemId, learnerId: user.id }),
    caseTurns(db, row.id),
  ])
  return {
    kind: 'dmr',
    quizId: id,
    itemId,
    position: item.position,
    prompt: item.prompt,
    caseId: row.id,
    mode: config.mode,
    readScale: config.readScale,
    interpretation: quiz.interpretation === 1,
    presentation: toPresentation(regenerateCase(row), config.mode),
    draft: row.draft_json ? JSON.parse(row.draft_json) : null,
    turns: turns.map(t => t.result),
    attempts: attempts.map(a => ({ attemptId: a.id, submittedAt: a.submitted_at })),
    attemptsLeft: Math.max(0, quiz.attempts_allowed - attempts.length),
    deadline: sitting.deadline_at,
    serverNow: nowIso(),
  }
})
