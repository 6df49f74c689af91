// The quiz clock. Every rule about time is decided here, on the server, from the
// stored open/close times and each sitting's start: the browser only displays it.
import { createError } from 'h3'
import type { QuizPhase, SittingStatus } from '#shared/types/quiz'
import type { QuizRow, QuizSittingRow } from '~~/db/schema'

type QuizTimes = Pick<QuizRow, 'published_at' | 'opens_at' | 'closes_at'>

export function quizPhase(q: QuizTimes, now: Date = new Date()): QuizPhase {
  if (!q.published_at) return 'draft'
  if (q.opens_at && now.getTime() < Date.parse(q.opens_at)) return 'upcoming'
  if (q.closes_at && now.getTime() >= Date.parse(q.closes_at)) return 'closed'
  return 'open'
}

/** Feedback (marks and the truth) is open once released, or at close when the tutor chose not to hold it. */
export function feedbackReleased(q: Pick<QuizRow, 'released_at' | 'hold_feedback' | 'closes_at'>, now: Date = new Date()): boolean {
  if (q.released_at) return true
  return !q.hold_feedback && !!q.closes_at && now.getTime() >= Date.parse(q.closes_at)
}

/** A sitting ends at the earlier of its start plus the time limit and the quiz's close time. */
export function sittingDeadline(q: Pick<QuizRow, 'time_limit_minutes' | 'closes_at'>, startedAt: string): string | null {
  const limits: number[] = []
  if (q.time_limit_minutes) limits.push(Date.parse(startedAt) + q.time_limit_minutes * 60_000)
  if (q.closes_at) limits.push(Date.parse(q.closes_at))
  return limits.length ? new Date(Math.min(...limits)).toISOString() : null
}

export function sittingStatus(s: Pick<QuizSittingRow, 'finished_at' | 'deadline_at'> | undefined | null, now: Date = new Date()): SittingStatus {
  if (!s) return 'not-started'
  if (s.finished_at) return 'finished'
  if (s.deadline_at && now.getTime() >= Date.parse(s.deadline_at)) return 'finished'
  return 'in-progress'
}

/** When the student's work stopped counting: finished, or the deadline passed. */
export function sittingEnd(s: Pick<QuizSittingRow, 'finished_at' | 'deadline_at'>, now: Date = new Date()): string | null {
  if (s.finished_at) return s.finished_at
  if (s.deadline_at && now.getTime() >= Date.parse(s.deadline_at)) return s.deadline_at
  return null
}

const clock = (iso: string) => `${new Date(iso).toISOString().slice(0, 16).replace('T', ' ')} UTC`

/** 409 for any change a student tries once their sitting has ended. */
export function assertSittingOpen(q: QuizRow, s: QuizSittingRow | undefined, now: Date = new Date()): QuizSittingRow {
  const phase = quizPhase(q, now)
  if (phase === 'upcoming') {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `This quiz opens at ${clock(q.opens_at!)}.`, data: { code: 'quiz-not-open' } })
  }
  if (q.released_at) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'The results of this quiz have been released: nothing more can be saved or submitted.', data: { code: 'quiz-released' } })
  }
  if (!s) {
    if (phase === 'closed') {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `This quiz closed at ${clock(q.closes_at!)}.`, data: { code: 'quiz-closed' } })
    }
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'Start the quiz first.', data: { code: 'quiz-not-started' } })
  }
  if (s.finished_at) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'You have finished this quiz; it can no longer be changed.', data: { code: 'quiz-finished' } })
  }
  if (s.deadline_at && now.getTime() >= Date.parse(s.deadline_at)) {
    throw createError({
      statusCode: 409,
      statusMessage: 'Conflict',
      message: `Time is up: this quiz ended for you at ${clock(s.deadline_at)}. Work saved before then is kept; nothing later is accepted.`,
      data: { code: 'quiz-time-up', deadline: s.deadline_at },
    })
  }
  return s
}
