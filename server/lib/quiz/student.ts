// One quiz as a student sees it: the sitting, each item's prompt and progress,
// and — only once feedback is open — marks, slips and the truth (a fundus item:
// the grading against the picture and the normal range).
import type { Kysely } from 'kysely'
import type { SessionUserData } from '#shared/auth/roles'
import type { StudentQuizDetail, StudentQuizItem } from '#shared/types/quiz'
import type { Database, QuizRow } from '~~/db/schema'
import { attemptFeedback } from './feedback'
import { readItemConfig } from './items'
import { computeResults } from './results'
import { studentSummary } from './present'
import { quizItems } from '~~/server/lib/data/quiz-items'
import { quizCaseRow, sittingOf } from './sitting'
import { fundusFeedbackOf, fundusItemPictures } from './fundus-item'
import { loadFundusOverrides } from './fundus-marks'
import { feedbackReleased } from './timing'

export async function studentQuizDetail(db: Kysely<Database>, user: SessionUserData, quiz: QuizRow): Promise<StudentQuizDetail> {
  const now = new Date()
  const [items, sitting, attempts, drafts, fundusAttempts, fundusDrafts] = await Promise.all([
    quizItems(db, quiz.id),
    sittingOf(db, quiz.id, user.id),
    db.selectFrom('attempts').selectAll().where('quiz_id', '=', quiz.id).where('learner_id', '=', user.id).where('kind', '=', 'quiz').orderBy('id').execute(),
    db.selectFrom('cases').select('quiz_item_id').where('quiz_id', '=', quiz.id).where('owner_id', '=', user.id).where('purpose', '=', 'quiz').where('draft_json', 'is not', null).execute(),
    db.selectFrom('fundus_attempts').selectAll().where('quiz_id', '=', quiz.id).where('learner_id', '=', user.id).where('kind', '=', 'quiz').orderBy('id').execute(),
    db.selectFrom('quiz_fundus_drafts').select('quiz_item_id').where('quiz_id', '=', quiz.id).where('student_id', '=', user.id).execute(),
  ])
  const open = feedbackReleased(quiz, now)
  const out: StudentQuizItem[] = []
  const fundusOverrides = open && fundusAttempts.length ? await loadFundusOverrides(db, quiz.id) : []
  for (const item of items) {
    const config = readItemConfig(item)
    const mine = config.kind === 'fundus' ? fundusAttempts.filter(a => a.quiz_item_id === item.id) : attempts.filter(a => a.quiz_item_id === item.id)
    const last = mine.at(-1)
    const entry: StudentQuizItem = {
      id: item.id,
      position: item.position,
      kind: config.kind,
      prompt: item.prompt,
      mode: config.kind === 'dmr' ? config.mode : null,
      readScale: config.kind === 'dmr' && config.readScale,
      saved: [...drafts, ...fundusDrafts].some(d => d.quiz_item_id === item.id),
      attempts: mine.length,
      attemptsLeft: Math.max(0, quiz.attempts_allowed - mine.length),
      lastSubmittedAt: last?.submitted_at ?? null,
    }
    if (open && last && config.kind === 'fundus' && 'result_json' in last) {
      const caseRow = config.source.type === 'photo' ? null : (await quizCaseRow(db, quiz.id, item.id, user.id)) ?? null
      entry.fundusFeedback = fundusFeedbackOf(last, config, fundusItemPictures(config, caseRow, last.fundus_version ?? undefined), fundusOverrides)
    }
    else if (open && last && 'slips_json' in last) {
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
