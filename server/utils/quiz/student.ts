// One quiz as a student sees it: the sitting, each item's prompt and progress,
// and — only once feedback is open — marks, slips and the truth.
import type { Kysely } from 'kysely'
import type { SessionUserData } from '#shared/auth/roles'
import type { StudentQuizDetail, StudentQuizItem } from '#shared/types/quiz'
import type { Database, QuizRow } from '~~/db/schema'
import { attemptFeedback } from './feedback'
import { readItemConfig } from './items'
import { computeResults } from './results'
import { studentSummary } from './present'
import { quizItems, sittingOf } from './sitting'
import { feedbackReleased } from './timing'

export async function studentQuizDetail(db: Kysely<Database>, user: SessionUserData, quiz: QuizRow): Promise<StudentQuizDetail> {
  const now = new Date()
  const [items, sitting, attempts, drafts] = await Promise.all([
    quizItems(db, quiz.id),
    sittingOf(db, quiz.id, user.id),
    db.selectFrom('attempts').selectAll().where('quiz_id', '=', quiz.id).where('learner_id', '=', user.id).where('kind', '=', 'quiz').orderBy('id').execute(),
    db.selectFrom('cases').select('quiz_item_id').where('quiz_id', '=', quiz.id).where('owner_id', '=', user.id).where('purpose', '=', 'quiz').where('draft_json', 'is not', null).execute(),
  ])
  const open = feedbackReleased(quiz, now)
  const out: StudentQuizItem[] = []
  for (const item of items) {
    const mine = attempts.filter(a => a.quiz_item_id === item.id)
    const last = mine.at(-1)
    const config = readItemConfig(item)
    const entry: StudentQuizItem = {
      id: item.id,
      position: item.position,
      prompt: item.prompt,
      mode: config.mode,
      readScale: config.readScale,
      saved: drafts.some(d => d.quiz_item_id === item.id),
      attempts: mine.length,
      attemptsLeft: Math.max(0, quiz.attempts_allowed - mine.length),
      lastSubmittedAt: last?.submitted_at ?? null,
    }
    if (open && last) {
      entry.feedback = await attemptFeedback(db, last, config, quiz.interpretation === 1)
    }
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
