// One quiz as a student sees it: the sitting, each item's prompt and progress,
// and — only once feedback is open — marks, slips and the truth (a fundus item:
// the grading against the picture and the normal range).
import type { Kysely } from 'kysely'
import type { SessionUserData } from '#shared/auth/roles'
import type { StudentQuizDetail, StudentQuizItem } from '#shared/types/quiz'
import type { Database, QuizRow } from '~~/db/schema'
import { QUIZ_ITEM_KINDS } from '#shared/schemas/quiz'
import { readItemConfig } from './items'
import { computeResults } from './results'
import { studentSummary } from './present'
import { quizItems } from '~~/server/lib/data/quiz-items'
import { sittingOf } from './sitting'
import type { QuizAttemptBase } from './item-kinds'
import { itemKind } from './item-kinds'
import { feedbackReleased } from './timing'

export async function studentQuizDetail(db: Kysely<Database>, user: SessionUserData, quiz: QuizRow): Promise<StudentQuizDetail> {
  const now = new Date()
  // the student's own attempts and drafts, of every item kind (each from its own tables)
  const [items, sitting, kinds] = await Promise.all([
    quizItems(db, quiz.id),
    sittingOf(db, quiz.id, user.id),
    Promise.all(QUIZ_ITEM_KINDS.map(async (kind) => {
      const [attempts, drafts] = await Promise.all([itemKind(kind).attempts(db, quiz.id, user.id), itemKind(kind).drafts(db, quiz.id, user.id)])
      return [kind, { attempts, drafts }] as const
    })),
  ])
  const attemptsOf = new Map<string, QuizAttemptBase[]>(kinds.map(([kind, k]) => [kind, k.attempts]))
  const drafts = kinds.flatMap(([, k]) => k.drafts)
  const open = feedbackReleased(quiz, now)
  const out: StudentQuizItem[] = []
  for (const item of items) {
    const config = readItemConfig(item)
    const mine = attemptsOf.get(config.kind)!.filter(a => a.quiz_item_id === item.id)
    const last = mine.at(-1)
    const entry: StudentQuizItem = {
      id: item.id,
      position: item.position,
      kind: config.kind,
      prompt: item.prompt,
      mode: config.kind === 'dmr' ? config.mode : null,
      readScale: config.kind === 'dmr' && config.readScale,
      saved: drafts.some(d => d.quiz_item_id === item.id),
      attempts: mine.length,
      attemptsLeft: Math.max(0, quiz.attempts_allowed - mine.length),
      lastSubmittedAt: last?.submitted_at ?? null,
    }
    // what feedback shows of the attempt that counts is the kind's own
    if (open && last) Object.assign(entry, await itemKind(config.kind).studentFeedback(db, quiz, item, config, last, user.id))
    out.push(entry)
  }
  const detail: StudentQuizDetail = { ...studentSummary(quiz, sitting, items.length, now), items: out }
  if (open) {
    // the same arithmetic as the tutor's table, so both always agree
    const mine = (await computeResults(db, quiz, now)).rows.find(r => r.studentId === user.id)
    if (mine) detail.total = { earned: mine.earned, possible: mine.possible, score: mine.score }
  }
  return detail
}
