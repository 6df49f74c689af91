// One fundus quiz attempt opened for review: the marks as the student placed them
// on the same picture, and — for staff always, for the student once feedback is
// open — the grading, the reference points and the item's marks as they stand.
import type { Kysely } from 'kysely'
import type { SessionUserData } from '#shared/auth/roles'
import type { FundusEyeMarks } from '#shared/engine/fundus/result'
import type { QuizFundusAttemptView } from '#shared/types/quiz'
import type { Database, FundusAttemptRow, QuizRow } from '~~/db/schema'
import type { FundusItemConfig } from './items'
import { readItemConfig } from './items'
import { fundusFeedbackOf, fundusItemPictures, referencePoints, studentItemImages } from './fundus-item'
import { markOverridesOf } from '~~/server/lib/data/mark-overrides'
import { feedbackReleased } from './timing'
import { quizItem } from '~~/server/lib/data/quiz-items'
import { countingFundusAttempt } from '~~/server/lib/data/attempts'

export async function quizFundusAttemptView(db: Kysely<Database>, viewer: SessionUserData, quiz: QuizRow, attempt: FundusAttemptRow): Promise<QuizFundusAttemptView> {
  const [item, caseRow, student, latest] = await Promise.all([
    quizItem(db, attempt.quiz_item_id!),
    attempt.case_id ? db.selectFrom('cases').selectAll().where('id', '=', attempt.case_id).executeTakeFirst() : Promise.resolve(undefined),
    db.selectFrom('users').select(['id', 'name', 'email']).where('id', '=', attempt.learner_id).executeTakeFirstOrThrow(),
    countingFundusAttempt(db, { quizId: quiz.id, itemId: attempt.quiz_item_id, learnerId: attempt.learner_id }),
  ])
  const config = readItemConfig(item) as FundusItemConfig
  const staff = viewer.role !== 'student'
  const open = staff || feedbackReleased(quiz)
  const pictures = fundusItemPictures(config, caseRow ?? null, attempt.fundus_version ?? undefined)
  const overrides = open ? (await markOverridesOf(db, 'quiz_fundus_overrides', quiz.id)).filter(o => o.attempt_id === attempt.id) : []
  return {
    quiz: { id: quiz.id, title: quiz.title },
    item: { id: item.id, position: item.position, prompt: item.prompt, eyes: pictures.eyes, ...(staff ? { title: config.source.title, tolerance: config.tolerance } : {}) },
    student: { id: student.id, name: student.name, ...(staff ? { email: student.email } : {}) },
    counts: latest.id === attempt.id,
    attempt: { id: attempt.id, marks: JSON.parse(attempt.marks_json) as Partial<Record<'RE' | 'LE', FundusEyeMarks>>, submittedAt: attempt.submitted_at },
    // a student sees the drawn picture as pixels until feedback opens (then the reference points are out anyway)
    presentation: open ? pictures.presentation : null,
    pictures: staff ? null : studentItemImages(quiz.id, item.id, pictures),
    photo: pictures.photo,
    feedbackOpen: open,
    reference: open ? referencePoints(pictures) : null,
    result: open ? fundusFeedbackOf(attempt, config, pictures, overrides, staff ? 'staff' : 'student') : null,
    overrides: staff ? overrides.map(o => ({ criterion: o.criterion, previousScore: o.previous_score, score: o.score, reason: o.reason, by: o.actorName, at: o.created_at })) : [],
  }
}
