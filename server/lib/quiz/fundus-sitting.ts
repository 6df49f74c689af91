// Sitting a fundus item: what the student's marker gets, autosave and submission.
// The same rules as a double Maddox rod item (server/api/quizzes/[id]/items/…):
// a sitting must be open to save or submit, attempts are counted per item, the
// last one counts, and nothing graded goes back until feedback opens.
import { createError } from 'h3'
import type { Kysely } from 'kysely'
import type { SessionUserData } from '#shared/auth/roles'
import type { FundusItemAttemptBody } from '#shared/schemas/fundus'
import type { FundusItemDraft } from '#shared/schemas/quiz'
import type { QuizAttemptReceipt, StudentFundusItem } from '#shared/types/quiz'
import type { Eye } from '#shared/engine/types'
import type { Database, QuizItemRow, QuizRow, QuizSittingRow } from '~~/db/schema'
import { nowIso } from '~~/server/utils/clock'
import { badRequest } from '~~/server/utils/validate'
import { storeFundusAttempt } from '~~/server/lib/fundus/attempts'
import { quizItemAttempts } from '~~/server/lib/data/attempts'
import { learnerCohortId } from '~~/server/lib/fundus/case-fundus'
import type { FundusItemConfig } from './items'
import { fundusDraftOf, fundusItemPictures, gradeFundusItem, studentItemImages } from './fundus-item'
import { ensureQuizCase, quizCaseRow } from './sitting'

export function fundusAttemptsOn(db: Kysely<Database>, quizId: number, itemId: number, studentId: number) {
  return quizItemAttempts(db, 'fundus_attempts', { quizId, itemId, learnerId: studentId })
}

export async function studentFundusItem(db: Kysely<Database>, user: SessionUserData, quiz: QuizRow, item: QuizItemRow, config: FundusItemConfig, sitting: QuizSittingRow): Promise<StudentFundusItem> {
  const row = await ensureQuizCase(db, quiz, item, user.id, nowIso())
  const pictures = fundusItemPictures(config, row)
  const [attempts, draft] = await Promise.all([fundusAttemptsOn(db, quiz.id, item.id, user.id), fundusDraftOf(db, item.id, user.id)])
  return {
    kind: 'fundus',
    quizId: quiz.id,
    itemId: item.id,
    position: item.position,
    prompt: item.prompt,
    eyes: pictures.eyes,
    // a generated picture goes as pixels: its disc and fovea coordinates are the answer's raw material
    presentation: null,
    pictures: studentItemImages(quiz.id, item.id, pictures),
    photo: pictures.photo,
    draft,
    attempts: attempts.map(a => ({ attemptId: a.id, submittedAt: a.submitted_at })),
    attemptsLeft: Math.max(0, quiz.attempts_allowed - attempts.length),
    deadline: sitting.deadline_at,
    serverNow: nowIso(),
  }
}

/** Autosave: one row per item and student, replaced on every save. */
export async function saveFundusDraft(db: Kysely<Database>, quizId: number, itemId: number, studentId: number, draft: FundusItemDraft): Promise<{ savedAt: string }> {
  const savedAt = nowIso()
  const json = JSON.stringify(draft)
  await db.insertInto('quiz_fundus_drafts')
    .values({ quiz_item_id: itemId, student_id: studentId, quiz_id: quizId, draft_json: json, saved_at: savedAt })
    .onConflict(oc => oc.columns(['quiz_item_id', 'student_id']).doUpdateSet({ draft_json: json, saved_at: savedAt }))
    .execute()
  return { savedAt }
}

/** 400 naming each eye the item asks for and the answer lacks, or each it does not ask for. */
function assertEyes(eyes: Eye[], body: FundusItemAttemptBody): void {
  const problems: { path: string, message: string }[] = []
  for (const e of eyes) if (!body.eyes[e]) problems.push({ path: `eyes.${e}`, message: `Mark the disc centre and fovea of the ${e === 'RE' ? 'right' : 'left'} eye and record its finding.` })
  for (const e of ['RE', 'LE'] as const) if (body.eyes[e] && !eyes.includes(e)) problems.push({ path: `eyes.${e}`, message: `This item shows only the ${eyes[0] === 'RE' ? 'right' : 'left'} eye.` })
  if (problems.length) badRequest(problems)
}

export async function submitFundusItem(db: Kysely<Database>, user: SessionUserData, quiz: QuizRow, item: QuizItemRow, config: FundusItemConfig, body: FundusItemAttemptBody): Promise<QuizAttemptReceipt> {
  const caseRow = config.source.type === 'photo' ? null : await quizCaseRow(db, quiz.id, item.id, user.id)
  if (config.source.type !== 'photo' && !caseRow) {
    throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'That quiz item was not found.', data: { code: 'not-found' } })
  }
  const pictures = fundusItemPictures(config, caseRow ?? null)
  assertEyes(pictures.eyes, body)
  const size = pictures.photo ?? pictures.presentation!.eyes.RE.frame
  const problems: { path: string, message: string }[] = []
  for (const e of pictures.eyes) {
    for (const which of ['disc', 'fovea'] as const) {
      const p = body.eyes[e]![which]
      if (p.x < 0 || p.x > size.width || p.y < 0 || p.y > size.height) {
        problems.push({ path: `eyes.${e}.${which}`, message: `The ${which === 'disc' ? 'disc centre' : 'fovea'} mark is off the picture (x 0–${size.width}, y 0–${size.height}).` })
      }
    }
  }
  if (problems.length) badRequest(problems)
  const used = await fundusAttemptsOn(db, quiz.id, item.id, user.id)
  if (used.length >= quiz.attempts_allowed) {
    throw createError({
      statusCode: 409,
      statusMessage: 'Conflict',
      message: quiz.attempts_allowed === 1 ? 'You have already submitted this item.' : `You have used all ${quiz.attempts_allowed} attempts on this item.`,
      data: { code: 'no-attempts-left' },
    })
  }
  const marks = Object.fromEntries(pictures.eyes.map(e => [e, body.eyes[e]!]))
  const result = gradeFundusItem(config, pictures, marks)
  const stored = await storeFundusAttempt({
    learnerId: user.id,
    cohortId: await learnerCohortId(user),
    kind: 'quiz',
    caseId: caseRow?.id ?? null,
    photoId: config.source.type === 'photo' ? config.source.id : null,
    quizId: quiz.id,
    quizItemId: item.id,
    fundusVersion: pictures.fundusVersion,
    marks,
    result,
  })
  const left = Math.max(0, quiz.attempts_allowed - used.length - 1)
  return {
    attemptId: stored.id,
    submittedAt: stored.submittedAt,
    attemptsLeft: left,
    message: `Submitted.${left ? ` You may submit this item ${left} more time${left === 1 ? '' : 's'}; the last one counts.` : ''} Marks and feedback come when your tutor releases the results.`,
  }
}
