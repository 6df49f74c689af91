// The two shared parts of the quiz attempt pages (every item kind, both audiences):
// the frame (way back, problem with an optional retry, loading line, heading, note,
// warnings, content) and a
// tutor's marks section with the list of changes.
import { describe, expect, it, vi } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import QuizAttemptFrame from '~/components/quiz/QuizAttemptFrame.vue'
import QuizAttemptStaffMarks from '~/components/quiz/QuizAttemptStaffMarks.vue'
import QuizMyAttemptFrame from '~/components/quiz/QuizMyAttemptFrame.vue'

const frame = (props: Record<string, unknown>, slots: Record<string, () => string> = {}) => mountSuspended(QuizAttemptFrame, {
  props: { back: '/quizzes/3/results', backWords: '← Results', error: null, loading: false, loadingWords: 'Loading the attempt…', ready: true, heading: 'Ada Park · item 2', ...props },
  slots: { default: () => 'The attempt itself', ...slots },
})

describe('QuizAttemptFrame', () => {
  it('shows the way back and the content', async () => {
    const w = await frame({})
    expect(w.find('a').attributes('href')).toBe('/quizzes/3/results')
    expect(w.find('a').text()).toBe('← Results')
    expect(w.text()).toContain('The attempt itself')
    expect(w.text()).not.toContain('Loading')
  })

  it('shows the heading, note, warning and notice only once the attempt is there', async () => {
    const w = await frame({ note: 'Marks appear here when your tutor releases the results.', notCounting: 'This attempt does not count.', notice: 'Mark changed.' })
    expect(w.find('h1').text()).toBe('Ada Park · item 2')
    for (const words of ['Marks appear here', 'This attempt does not count.', 'Mark changed.']) expect(w.text()).toContain(words)
    const waiting = await frame({ ready: false, loading: true, note: 'Marks appear here', notCounting: 'This attempt does not count.' })
    expect(waiting.find('h1').exists()).toBe(false)
    expect(waiting.text()).not.toContain('The attempt itself')
    expect(waiting.text()).not.toContain('does not count')
  })

  it('puts the staff line under the heading when given one', async () => {
    const w = await frame({}, { subtitle: () => 'Week 3 quiz · tolerance 2°' })
    expect(w.find('h1 + p').text()).toBe('Week 3 quiz · tolerance 2°')
    expect((await frame({})).find('h1 + p').exists()).toBe(false)
  })

  it('shows the loading line only while loading and without a problem', async () => {
    expect((await frame({ loading: true })).text()).toContain('Loading the attempt…')
    const failed = await frame({ loading: true, error: { statusCode: 404, data: { message: 'That attempt was not found.' } } })
    expect(failed.text()).not.toContain('Loading the attempt…')
    expect(failed.text()).toContain('That attempt was not found.')
  })

  it('offers "Try again" only when given a retry, and calls it', async () => {
    const error = { statusCode: 500 }
    const plain = await frame({ error })
    expect(plain.text()).toContain('Something went wrong. Please try again.')
    expect(plain.findAll('button').filter(b => b.text() === 'Try again')).toHaveLength(0)
    const retry = vi.fn()
    const w = await frame({ error, retry })
    const button = w.findAll('button').find(b => b.text() === 'Try again')!
    await button.trigger('click')
    expect(retry).toHaveBeenCalledTimes(1)
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

describe('QuizMyAttemptFrame', () => {
  const mine = (result: unknown) => mountSuspended(QuizMyAttemptFrame, {
    props: { quizId: 4, view: { quiz: { title: 'Week 3 quiz' }, item: { position: 2 }, result }, error: null, loading: false },
    slots: { default: () => 'my bench' },
  })

  it('leads back to the quiz, names the quiz and item, and says marks come at release', async () => {
    const w = await mine(null)
    expect(w.find('a').attributes('href')).toBe('/student/quizzes/4')
    expect(w.find('h1').text()).toBe('Week 3 quiz · item 2')
    expect(w.text()).toContain('Marks appear here when your tutor releases the results.')
    expect(w.text()).toContain('my bench')
  })

  it('drops the note once the marks are there', async () => {
    expect((await mine({ score: 1 })).text()).not.toContain('Marks appear here')
  })
})
