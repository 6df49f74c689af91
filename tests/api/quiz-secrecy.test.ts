// No student-facing quiz response carries an item's condition, signed torsion,
// direction or model record before release: every route a student calls, for
// several students, on items from many templates in both modes.
import { describe, expect, inject, it } from 'vitest'
import { DEMO, signedIn } from '../support/client'
import { cohortIds, minutesFromNow, patientFor, publishQuiz } from '../support/quiz'
import { caseSecrets, findCaseSecrets } from '../support/secrecy'

const baseURL = inject('baseURL')
const STUDENTS = [DEMO.student, 'oisin.marrable@cyclodial.test', 'adaeze.quillon@cyclodial.test']
const TEMPLATES = ['so-palsy-left-challenging', 'bilateral-so-palsy-standard', 'io-palsy-right-standard', 'skew-deviation-standard', 'long-standing-so-palsy-challenging', 'suppression-standard', 'ted-ir-restriction-challenging', 'normal-standard']
const OWN_INPUT = [/(^|\.)draft\.record$/, /(^|\.)attempt\.record$/, /(^|\.)attempt\.interpretation(\.|$)/]
const QUIZ_COUNTS = [/(^|\.)(itemId|quizId|position|attempts|attemptsLeft|attemptsAllowed|itemCount|timeLimitMinutes)$/]

describe('quiz secrecy before release', () => {
  it('keeps every item\'s truth out of every student response', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const quiz = await publishQuiz(tutor, {
      title: 'Mixed patients',
      opensAt: minutesFromNow(-1),
      closesAt: minutesFromNow(90),
      attemptsAllowed: 2,
      interpretation: true,
      cohortIds: [(await cohortIds(admin))['Kestrel cohort']],
    }, TEMPLATES.map((templateId, i) => ({ kind: 'dmr', prompt: `Patient ${i + 1}`, source: { type: 'engine', templateId }, mode: i % 2 ? 'learner-turns' : 'patient-turns' })))

    const leaks: string[] = []
    let scanned = 0
    for (const email of STUDENTS) {
      const student = await signedIn(baseURL, email)
      const me = (await student.get('/api/auth/me')).body.user.id
      const replies: [string, unknown][] = []
      replies.push(['start', (await student.post(`/api/quizzes/${quiz.id}/start`)).body])
      for (const item of quiz.items) {
        const path = `/api/quizzes/${quiz.id}/items/${item.id}`
        const got = await student.get(path)
        expect(got.status).toBe(200)
        replies.push([`item ${item.position}`, got.body])
        if (got.body.mode === 'patient-turns') {
          replies.push([`turn ${item.position}`, (await student.post(`${path}/turns`, { gaze: 'primary', distance: 'near' })).body])
        }
        replies.push([`draft ${item.position}`, (await student.put(`${path}/draft`, { gaze: 'primary', distance: 'near', readings: { RE: 93, LE: 88 }, record: 'DMR near primary RE 3 ex' })).body])
        const sent = await student.post(`${path}/attempts`, { gaze: 'primary', distance: 'near', readings: { RE: 93, LE: 88 }, record: 'DMR near primary RE 3 ex', ...(got.body.mode === 'patient-turns' ? { trial: 1 } : {}), interpretation: { higherEye: 'RE' } })
        expect(sent.status, JSON.stringify(sent.body)).toBe(201)
        replies.push([`attempt ${item.position}`, sent.body])
        replies.push([`attempt view ${item.position}`, (await student.get(`/api/quizzes/${quiz.id}/attempts/${sent.body.attemptId}`)).body])
        replies.push([`item again ${item.position}`, (await student.get(path)).body])
      }
      replies.push(['detail', (await student.get(`/api/quizzes/${quiz.id}`)).body])
      replies.push(['list', (await student.get('/api/quizzes')).body])

      for (const item of quiz.items) {
        const seed = (await tutor.get(`/api/quizzes/${quiz.id}/items/${item.id}/cases/${me}`)).body.seed
        const secrets = caseSecrets(patientFor(item, seed))
        for (const [what, body] of replies) {
          scanned++
          for (const leak of findCaseSecrets(body, secrets, { ignore: OWN_INPUT, allowNumbersAt: QUIZ_COUNTS })) leaks.push(`${email} ${what}: ${leak}`)
        }
      }
    }
    expect(scanned).toBeGreaterThan(STUDENTS.length * TEMPLATES.length * 30)
    expect(leaks).toEqual([])

    // the interpretation step counts only where the patient had cover-test findings to interpret
    const mine = (await tutor.get(`/api/quizzes/${quiz.id}/results?q=arkwell`)).body.items[0]
    const criteriaOf = (templateId: string) => mine.items[quiz.items[TEMPLATES.indexOf(templateId)]!.id].marks.map((m: { criterion: string }) => m.criterion)
    expect(criteriaOf('normal-standard')).not.toContain('interpretation')
    expect(criteriaOf('so-palsy-left-challenging')).toContain('interpretation')
  })
})
