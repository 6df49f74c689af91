// Feedback on a quiz attempt: the result exactly as the grader first gave it
// (attemptResultFromRow), with the quiz's interpretation weight and the tutor's
// overrides applied to the marks, score and points.
import type { Kysely } from 'kysely'
import type { StudentItemFeedback } from '#shared/types/quiz'
import type { AttemptRow, Database } from '~~/db/schema'
import { attemptResultFromRow } from '~~/server/lib/practice/attempts'
import type { QuizItemConfig } from './items'
import { effectiveMarks, feedbackMarks } from './marks'
import { markOverridesOf } from '~~/server/lib/data/mark-overrides'

export async function attemptFeedback(db: Kysely<Database>, attempt: AttemptRow, config: QuizItemConfig, interpretationOn: boolean, audience: 'student' | 'staff' = 'student'): Promise<StudentItemFeedback> {
  const overrides = (await markOverridesOf(db, 'quiz_mark_overrides', attempt.quiz_id!)).filter(o => o.attempt_id === attempt.id)
  const marks = effectiveMarks(attempt, config, interpretationOn, overrides)
  return { ...attemptResultFromRow(attempt), ...feedbackMarks(marks, audience, JSON.parse(attempt.slips_json) as { code: string }[]) }
}
