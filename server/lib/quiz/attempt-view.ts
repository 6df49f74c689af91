// One quiz attempt opened for review: the bench as the student left it (gaze,
// distance, readings, prisms, lights, record, the trial they read) and — for staff
// always, for the student once feedback is open — the marks as they stand.
import type { Kysely } from 'kysely'
import type { SessionUserData } from '#shared/auth/roles'
import type { PatientTurnsResult } from '#shared/engine/presentation'
import type { QuizAttemptView } from '#shared/types/quiz'
import type { Distance, Gaze, Lights, PerEye, Prism } from '#shared/engine/types'
import type { AttemptRow, Database, QuizRow } from '~~/db/schema'
import { caseTurns, regenerateCase } from '~~/server/lib/practice/cases'
import { toPresentation } from '~~/server/lib/engine/presentation'
import { attemptFeedback } from './feedback'
import { readItemConfig } from './items'
import { markOverridesOf } from '~~/server/lib/data/mark-overrides'
import { feedbackReleased } from './timing'
import { quizItem } from '~~/server/lib/data/quiz-items'
import { countingAttempt } from '~~/server/lib/data/attempts'

export async function quizAttemptView(db: Kysely<Database>, viewer: SessionUserData, quiz: QuizRow, attempt: AttemptRow): Promise<QuizAttemptView> {
  const [item, caseRow, student, latest] = await Promise.all([
    quizItem(db, attempt.quiz_item_id!),
    db.selectFrom('cases').selectAll().where('id', '=', attempt.case_id).executeTakeFirstOrThrow(),
    db.selectFrom('users').select(['id', 'name', 'email']).where('id', '=', attempt.learner_id).executeTakeFirstOrThrow(),
    countingAttempt(db, { quizId: quiz.id, itemId: attempt.quiz_item_id, learnerId: attempt.learner_id }),
  ])
  const config = readItemConfig(item)
  // double Maddox rod attempts only ever belong to double Maddox rod items
  if (config.kind !== 'dmr') throw new Error(`Attempt ${attempt.id} is on a ${config.kind} item.`)
  const staff = viewer.role !== 'student'
  const open = staff || feedbackReleased(quiz)
  const turn = attempt.trial ? (await caseTurns(db, caseRow.id)).find(t => t.trial === attempt.trial)?.result ?? null : null
  const interpretation = attempt.interpretation_json ? (JSON.parse(attempt.interpretation_json) as { given?: unknown }).given ?? null : null
  const overrides = staff ? (await markOverridesOf(db, 'quiz_mark_overrides', quiz.id)).filter(o => o.attempt_id === attempt.id) : []
  return {
    quiz: { id: quiz.id, title: quiz.title },
    item: { id: item.id, position: item.position, prompt: item.prompt, mode: config.mode, readScale: config.readScale, ...(staff ? { title: config.source.title, tolerance: config.tolerance } : {}) },
    student: { id: student.id, name: student.name, ...(staff ? { email: student.email } : {}) },
    counts: latest.id === attempt.id,
    attempt: {
      id: attempt.id,
      gaze: attempt.gaze as Gaze,
      distance: attempt.distance as Distance,
      readings: JSON.parse(attempt.readings_json) as PerEye<number>,
      prisms: JSON.parse(attempt.prisms_json) as Prism[],
      lights: attempt.lights as Lights,
      record: attempt.record_text,
      trial: attempt.trial,
      interpretation,
      startedAt: attempt.started_at,
      submittedAt: attempt.submitted_at,
    },
    /** Patient-turns: where the patient left the rods on the trial the student read. */
    turn: turn as PatientTurnsResult | null,
    case: { id: caseRow.id, mode: caseRow.mode, readScale: caseRow.read_scale === 1, presentation: toPresentation(regenerateCase(caseRow), caseRow.mode) },
    feedbackOpen: open,
    result: open ? await attemptFeedback(db, attempt, config, quiz.interpretation === 1, staff ? 'staff' : 'student') : null,
    overrides: overrides.map(o => ({ criterion: o.criterion, previousScore: o.previous_score, score: o.score, reason: o.reason, by: o.actorName, at: o.created_at })),
  }
}
