import { describe, expect, it } from 'vitest'
import type { QuizRow } from '~~/db/schema'
import { assertSittingOpen, feedbackReleased, quizPhase, sittingDeadline, sittingStatus } from '~~/server/lib/quiz/timing'

const at = (iso: string) => new Date(iso)
const quiz = (over: Partial<QuizRow> = {}): QuizRow => ({
  id: 1, owner_id: 1, title: 'Q', instructions: '', seed: 's', time_limit_minutes: 30,
  opens_at: '2026-03-01T09:00:00.000Z', closes_at: '2026-03-01T12:00:00.000Z',
  attempts_allowed: 1, interpretation: 0, hold_feedback: 1, published_at: '2026-02-01T00:00:00.000Z',
  released_at: null, released_by: null, archived_at: null, duplicated_from: null, created_at: '', updated_at: '',
  ...over,
})

describe('the quiz clock', () => {
  it('names the phase from publication and the open and close times', () => {
    expect(quizPhase(quiz({ published_at: null }), at('2026-03-01T10:00:00Z'))).toBe('draft')
    expect(quizPhase(quiz(), at('2026-03-01T08:59:59Z'))).toBe('upcoming')
    expect(quizPhase(quiz(), at('2026-03-01T09:00:00Z'))).toBe('open')
    expect(quizPhase(quiz(), at('2026-03-01T12:00:00Z'))).toBe('closed')
  })

  it('ends a sitting at the earlier of start + time limit and the close time', () => {
    expect(sittingDeadline(quiz(), '2026-03-01T10:00:00.000Z')).toBe('2026-03-01T10:30:00.000Z')
    expect(sittingDeadline(quiz(), '2026-03-01T11:45:00.000Z')).toBe('2026-03-01T12:00:00.000Z')
    expect(sittingDeadline(quiz({ time_limit_minutes: null, closes_at: null }), '2026-03-01T10:00:00.000Z')).toBeNull()
  })

  it('refuses changes after the deadline with a message that says saved work stays', () => {
    const s = { id: 1, quiz_id: 1, student_id: 2, started_at: '2026-03-01T10:00:00.000Z', deadline_at: '2026-03-01T10:30:00.000Z', finished_at: null }
    expect(assertSittingOpen(quiz(), s, at('2026-03-01T10:29:59Z'))).toBe(s)
    expect(() => assertSittingOpen(quiz(), s, at('2026-03-01T10:30:00Z'))).toThrow(/Time is up.*Work saved before then is kept/)
    expect(() => assertSittingOpen(quiz(), { ...s, finished_at: '2026-03-01T10:10:00.000Z' }, at('2026-03-01T10:11:00Z'))).toThrow(/finished/)
    expect(() => assertSittingOpen(quiz(), undefined, at('2026-03-01T12:30:00Z'))).toThrow(/closed/)
    expect(sittingStatus(s, at('2026-03-01T10:31:00Z'))).toBe('finished')
    expect(sittingStatus(undefined)).toBe('not-started')
  })

  it('opens feedback on release, or at close when the tutor does not hold it', () => {
    expect(feedbackReleased(quiz(), at('2026-03-02T00:00:00Z'))).toBe(false)
    expect(feedbackReleased(quiz({ released_at: '2026-03-01T13:00:00.000Z' }))).toBe(true)
    expect(feedbackReleased(quiz({ hold_feedback: 0 }), at('2026-03-01T11:59:00Z'))).toBe(false)
    expect(feedbackReleased(quiz({ hold_feedback: 0 }), at('2026-03-01T12:00:00Z'))).toBe(true)
  })
})
