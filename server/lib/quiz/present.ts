// Turns quiz rows into the shapes in shared/types/quiz.ts. Student shapes carry
// no item source, template, condition or truth: only prompts and the sitting.
import type { Kysely } from 'kysely'
import type { SessionUserData } from '#shared/auth/roles'
import type { QuizSettings, StaffQuizSummary, StudentQuizSummary } from '#shared/types/quiz'
import type { Database, QuizRow, QuizSittingRow } from '~~/db/schema'
import { feedbackReleased, quizPhase, sittingStatus } from './timing'
import { cohortIdsOfUser, managesQuiz } from './access'
import { quizItemCounts } from '~~/server/lib/data/quiz-items'

export function quizSettings(q: QuizRow, now: Date = new Date()): QuizSettings {
  return {
    id: q.id,
    title: q.title,
    instructions: q.instructions,
    timeLimitMinutes: q.time_limit_minutes,
    opensAt: q.opens_at,
    closesAt: q.closes_at,
    attemptsAllowed: q.attempts_allowed,
    interpretation: q.interpretation === 1,
    holdFeedback: q.hold_feedback === 1,
    phase: quizPhase(q, now),
    published: q.published_at !== null,
    archived: q.archived_at !== null,
    releasedAt: q.released_at,
    feedbackOpen: feedbackReleased(q, now),
  }
}

/** Staff summaries for many quizzes at once (cohorts, item and sitting counts). */
export async function staffSummaries(db: Kysely<Database>, user: SessionUserData, quizzes: QuizRow[], now: Date = new Date()): Promise<StaffQuizSummary[]> {
  if (!quizzes.length) return []
  const ids = quizzes.map(q => q.id)
  // a tutor's counts are of their own cohorts' students only
  const reach = user.role === 'tutor' ? await cohortIdsOfUser(db, user.id) : null
  const inReach = reach ? (reach.length ? reach : [-1]) : null
  const [cohorts, items, sittings, students, owners] = await Promise.all([
    db.selectFrom('quiz_cohorts').innerJoin('cohorts', 'cohorts.id', 'quiz_cohorts.cohort_id')
      .select(['quiz_cohorts.quiz_id', 'cohorts.id', 'cohorts.name']).where('quiz_cohorts.quiz_id', 'in', ids).orderBy('cohorts.name').execute(),
    quizItemCounts(db, ids),
    db.selectFrom('quiz_sittings').select(['quiz_id', 'finished_at', 'deadline_at']).where('quiz_id', 'in', ids)
      .$if(!!inReach, q => q.where('student_id', 'in', eb => eb.selectFrom('cohort_members').select('user_id').where('cohort_id', 'in', inReach!)))
      .execute(),
    db.selectFrom('quiz_cohorts')
      .innerJoin('cohort_members', 'cohort_members.cohort_id', 'quiz_cohorts.cohort_id')
      .innerJoin('users', 'users.id', 'cohort_members.user_id')
      .select(['quiz_cohorts.quiz_id', eb => eb.fn.countAll<number>().as('n')])
      .where('quiz_cohorts.quiz_id', 'in', ids).where('users.role', '=', 'student')
      .$if(!!inReach, q => q.where('quiz_cohorts.cohort_id', 'in', inReach!))
      .groupBy('quiz_cohorts.quiz_id').execute(),
    db.selectFrom('users').select(['id', 'name']).where('id', 'in', quizzes.map(q => q.owner_id ?? 0)).execute(),
  ])
  return quizzes.map(q => ({
    ...quizSettings(q, now),
    ownerName: owners.find(o => o.id === q.owner_id)?.name ?? null,
    mine: q.owner_id === user.id,
    canManage: managesQuiz(user, q),
    cohorts: cohorts.filter(c => c.quiz_id === q.id).map(c => ({ id: c.id, name: c.name })),
    itemCount: Number(items.find(i => i.quiz_id === q.id)?.n ?? 0),
    students: Number(students.find(s => s.quiz_id === q.id)?.n ?? 0),
    started: sittings.filter(s => s.quiz_id === q.id).length,
    finished: sittings.filter(s => s.quiz_id === q.id && sittingStatus(s, now) === 'finished').length,
  }))
}

export function studentSummary(q: QuizRow, sitting: QuizSittingRow | undefined, itemCount: number, now: Date = new Date()): StudentQuizSummary {
  const s = quizSettings(q, now)
  return {
    id: q.id,
    title: q.title,
    instructions: q.instructions,
    phase: s.phase,
    opensAt: q.opens_at,
    closesAt: q.closes_at,
    timeLimitMinutes: q.time_limit_minutes,
    attemptsAllowed: q.attempts_allowed,
    interpretation: s.interpretation,
    itemCount,
    feedbackOpen: s.feedbackOpen,
    sitting: {
      status: sittingStatus(sitting, now),
      startedAt: sitting?.started_at ?? null,
      deadline: sitting?.deadline_at ?? null,
      finishedAt: sitting?.finished_at ?? null,
    },
  }
}
