// POST /api/quizzes/:id/items/:itemId/attempts (student): as for practice (`trial` in
// patient-turns), or for a fundus item `{ eyes: { RE?, LE?: { disc, fovea, finding } }
// }` with exactly the item's eyes (`400` naming `eyes.RE`… when one is missing, extra or
// off the picture) → `201 { attemptId, submittedAt, attemptsLeft, message }` — no marks;
// `409` after the deadline, the close time, finishing, the release of the results, or
// the last allowed submission
import type { GradeCriterion } from '~~/server/lib/engine/grader'
import { practiceAttemptSchema } from '#shared/schemas/practice'
import { quizItemParams } from '#shared/schemas/quiz'
import { fundusItemAttemptBody } from '#shared/schemas/fundus'
import { submitFundusItem } from '~~/server/lib/quiz/fundus-sitting'
import type { QuizAttemptReceipt } from '#shared/types/quiz'
import { quizForStudent } from '~~/server/lib/quiz/access'
import { readItemConfig } from '~~/server/lib/quiz/items'
import { quizCaseRow, sittingOf } from '~~/server/lib/quiz/sitting'
import { assertSittingOpen } from '~~/server/lib/quiz/timing'
import { recordAttempt } from '~~/server/lib/practice/attempts'
import { withCaseErrors } from '~~/server/lib/practice/http'
import { withKeyLock } from '~~/server/lib/quiz/lock'
import { regenerateCase } from '~~/server/lib/practice/cases'
import { toPresentation } from '~~/server/lib/engine/presentation'
import type { CaseRow } from '~~/db/schema'
import { quizItemOf } from '~~/server/lib/data/quiz-items'
import { quizItemAttemptCount } from '~~/server/lib/data/attempts'

/** Whether the student was shown cover-test findings to interpret (the bench offers the step only then). */
const hasCoverTest = (row: CaseRow) => !!toPresentation(regenerateCase(row), row.mode).coverTest

// Submit an item: graded and stored by recordAttempt (kind 'quiz') with the item's
// tolerance and weights. The answer carries no marks: they wait for release. A
// fundus item is graded by the fundus grading and stored in fundus_attempts.
export default defineEventHandler(async (event): Promise<QuizAttemptReceipt> => {
  const user = await requireRole(event, 'student')
  const { id, itemId } = paramsAs(event, quizItemParams)
  const db = await useDb()
  const quiz = await quizForStudent(db, user, id)
  const item = await quizItemOf(db, id, itemId)
  const itemConfig = readItemConfig(item)
  if (itemConfig.kind === 'fundus') {
    const marks = await readBodyAs(event, fundusItemAttemptBody)
    return withKeyLock(`attempt/${id}/${itemId}/${user.id}`, async () => {
      assertSittingOpen(quiz, await sittingOf(db, id, user.id))
      const receipt = await submitFundusItem(db, user, quiz, item, itemConfig, marks)
      setResponseStatus(event, 201)
      return receipt
    })
  }
  const { trial, interpretation, ...attempt } = await readBodyAs(event, practiceAttemptSchema)
  return withKeyLock(`attempt/${id}/${itemId}/${user.id}`, async () => {
    const sitting = assertSittingOpen(quiz, await sittingOf(db, id, user.id))
    const row = await quizCaseRow(db, id, itemId, user.id)
    if (!row) notFound('That quiz item')
    const used = await quizItemAttemptCount(db, 'attempts', { quizId: id, itemId, learnerId: user.id })
    if (used >= quiz.attempts_allowed) {
      throw createError({
        statusCode: 409,
        statusMessage: 'Conflict',
        message: quiz.attempts_allowed === 1 ? 'You have already submitted this item.' : `You have used all ${quiz.attempts_allowed} attempts on this item.`,
        data: { code: 'no-attempts-left' },
      })
    }
    const config = itemConfig
    const { interpretation: _i, ...gradeWeights } = config.weights
    const recorded = await withCaseErrors(() => recordAttempt(db, {
      caseRow: row,
      learnerId: user.id,
      kind: 'quiz',
      // the interpretation step is marked when the quiz asks for it and the patient has
      // cover-test findings to interpret (an empty answer is marked, and scores nothing)
      attempt: { ...attempt, ...(quiz.interpretation === 1 && hasCoverTest(row) ? { interpretation: interpretation ?? {} } : {}) },
      trial: row.mode === 'patient-turns' ? trial : null,
      options: { tolerance: config.tolerance, weights: gradeWeights as Record<GradeCriterion, number> },
      quizId: id,
      quizItemId: itemId,
      startedAt: sitting.started_at,
    }))
    setResponseStatus(event, 201)
    const left = Math.max(0, quiz.attempts_allowed - used - 1)
    return {
      attemptId: recorded.attemptId,
      submittedAt: recorded.submittedAt,
      attemptsLeft: left,
      message: `Submitted.${left ? ` You may submit this item ${left} more time${left === 1 ? '' : 's'}; the last one counts.` : ''} Marks and feedback come when your tutor releases the results.`,
    }
  })
})
