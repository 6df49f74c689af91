// A quiz that does not hold feedback opens it to students at the close time, with no
// release; before the close nothing is shown.
import { describe, expect, inject, it } from 'vitest'
import { DEMO, signedIn } from '../support/client'
import { cohortIds, minutesFromNow, publishQuiz } from '../support/quiz'

const baseURL = inject('baseURL')

describe('feedback not held', () => {
  it('opens at the close time without a release', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const quiz = await publishQuiz(tutor, {
      title: 'Open feedback',
      opensAt: minutesFromNow(-2),
      closesAt: minutesFromNow(30),
      holdFeedback: false,
      cohortIds: [(await cohortIds(admin))['Kestrel cohort']],
    }, [{ kind: 'dmr', source: { type: 'engine', templateId: 'so-palsy-right-standard' }, mode: 'learner-turns' }])
    const student = await signedIn(baseURL, 'oisin.marrable@cyclodial.test')
    await student.post(`/api/quizzes/${quiz.id}/start`)
    const item = quiz.items[0]!
    const sent = await student.post(`/api/quizzes/${quiz.id}/items/${item.id}/attempts`, { gaze: 'primary', distance: 'near', readings: { RE: 96, LE: 89 }, record: 'DMR, near, primary position: RE 6° excyclotorsion, LE 1° excyclotorsion' })
    expect(sent.status).toBe(201)
    const before = (await student.get(`/api/quizzes/${quiz.id}`)).body
    expect(before.feedbackOpen).toBe(false)
    expect(before.items[0].feedback).toBeUndefined()

    await tutor.patch(`/api/quizzes/${quiz.id}`, { closesAt: minutesFromNow(-0.01) })
    const after = (await student.get(`/api/quizzes/${quiz.id}`)).body
    expect(after.feedbackOpen).toBe(true)
    expect(after.items[0].feedback.truth.condition).toBe('so-palsy')
    expect(after.items[0].feedback.marks.length).toBeGreaterThan(3)
    expect((await tutor.get(`/api/quizzes/${quiz.id}`)).body.releasedAt).toBeNull()
  })
})
