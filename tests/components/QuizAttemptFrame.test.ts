// The two shared parts of the quiz attempt pages (every item kind, both audiences):
// the frame (way back, problem with an optional retry, loading line, heading, the
// staff line, note and warnings, content) and a tutor's marks section with the list
// of changes.
import { describe, expect, it, vi } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import QuizAttemptFrame from '~/components/quiz/QuizAttemptFrame.vue'
import QuizAttemptStaffMarks from '~/components/quiz/QuizAttemptStaffMarks.vue'

const view = { quiz: { title: 'Week 3 quiz' }, student: { name: 'Ada Park' }, item: { position: 2 }, counts: true, result: null }
const frame = (props: Record<string, unknown>, slots: Record<string, () => string> = {}) => mountSuspended(QuizAttemptFrame, {
  props: { audience: 'staff', quizId: 3, view, error: null, loading: false, later: 'submitted this item again', ...props },
  slots: { default: () => 'The attempt itself', ...slots },
})

describe('QuizAttemptFrame for staff', () => {
  it('leads back to the results and names the student and item, with the kind\'s line under it', async () => {
    const w = await frame({}, { subtitle: () => 'Week 3 quiz · tolerance 2°' })
    expect(w.find('a').attributes('href')).toBe('/quizzes/3/results')
    expect(w.find('a').text()).toBe('← Results')
    expect(w.find('h1').text()).toBe('Ada Park · item 2')
    expect(w.find('h1 + p').text()).toBe('Week 3 quiz · tolerance 2°')
    expect(w.text()).toContain('The attempt itself')
    expect(w.text()).not.toContain('does not count')
  })

  it('warns, in the kind\'s words, when a later attempt counts, and shows the notice of a change', async () => {
    const w = await frame({ view: { ...view, counts: false }, notice: 'Mark changed.', later: 'handed this item in again' })
    expect(w.text()).toContain('The student handed this item in again later; this attempt does not count.')
    expect(w.text()).toContain('Mark changed.')
  })

  it('shows the loading line only while loading and without a problem, and nothing of the attempt', async () => {
    const waiting = await frame({ view: null, loading: true })
    expect(waiting.text()).toContain('Loading the attempt…')
    expect(waiting.find('h1').exists()).toBe(false)
    expect(waiting.text()).not.toContain('The attempt itself')
    const failed = await frame({ view: null, loading: true, error: { statusCode: 404, data: { message: 'That attempt was not found.' } } })
    expect(failed.text()).not.toContain('Loading the attempt…')
    expect(failed.text()).toContain('That attempt was not found.')
  })

  it('offers "Try again" only when given a retry, and calls it', async () => {
    const error = { statusCode: 500 }
    const plain = await frame({ view: null, error })
    expect(plain.text()).toContain('Something went wrong. Please try again.')
    expect(plain.findAll('button').filter(b => b.text() === 'Try again')).toHaveLength(0)
    const retry = vi.fn()
    const w = await frame({ view: null, error, retry })
    await w.findAll('button').find(b => b.text() === 'Try again')!.trigger('click')
    expect(retry).toHaveBeenCalledTimes(1)
  })
})

describe('QuizAttemptFrame for the student', () => {
  it('leads back to the quiz, names the quiz and item, and says marks come at release', async () => {
    const w = await frame({ audience: 'student', view: { ...view, counts: false } })
    expect(w.find('a').attributes('href')).toBe('/student/quizzes/3')
    expect(w.find('a').text()).toBe('← Back to the quiz')
    expect(w.find('h1').text()).toBe('Week 3 quiz · item 2')
    expect(w.text()).toContain('Marks appear here when your tutor releases the results.')
    // the staff-only warning is not the student's
    expect(w.text()).not.toContain('does not count')
    expect(w.text()).toContain('The attempt itself')
  })

  it('drops the note once the marks are there, and says only "Loading…" while loading', async () => {
    expect((await frame({ audience: 'student', view: { ...view, result: { score: 1 } } })).text()).not.toContain('Marks appear here')
    const waiting = await frame({ audience: 'student', view: null, loading: true })
    expect(waiting.find('p').text()).toBe('Loading…')
  })
})

describe('QuizAttemptStaffMarks', () => {
  it('lists each change with its criterion in words, the scores, who and why', async () => {
    const w = await mountSuspended(QuizAttemptStaffMarks, {
      props: { overrides: [{ criterion: 'fundusAngle', previousScore: 0, score: 1, reason: 'Disc placed well.', by: 'Tutor One', at: '2026-11-02T10:00:00.000Z' }] },
      slots: { default: () => 'the marks panel' },
    })
    expect(w.find('h2').text()).toBe('Marks')
    expect(w.text()).toContain('the marks panel')
    const item = w.find('li').text()
    expect(item).toContain('0 → 1 by Tutor One')
    expect(item).toContain('“Disc placed well.”')
    expect(item).not.toContain('fundusAngle')
  })

  it('has no list of changes when nothing was changed', async () => {
    const w = await mountSuspended(QuizAttemptStaffMarks, { props: { overrides: [] } })
    expect(w.text()).not.toContain('Changes')
  })
})
