// The demo school's quizzes: every cohort sees a finished quiz with released
// results, one open now and one scheduled; the released results were graded by
// recordAttempt and show a spread of marks and slips.
import { describe, expect, inject, it } from 'vitest'
import { DEMO, signedIn } from '../support/client'
import { readDb } from '../support/db'

const baseURL = inject('baseURL')
const DEMO_TITLES = /^(Week 3: writing the record|Week 6: patients who look different|End-of-term assessment)$/
const dbPath = inject('dbPath')

describe('demo quizzes', () => {
  it('give each cohort a released, an open and a scheduled quiz', async () => {
    for (const [tutorEmail, studentEmail] of [[DEMO.tutor, DEMO.student], [DEMO.tutor2, 'milo.strathearn@cyclodial.test']] as const) {
      const tutor = await signedIn(baseURL, tutorEmail)
      const demo = (await tutor.get('/api/quizzes')).body.items.filter((q: { title: string }) => DEMO_TITLES.test(q.title))
      expect(demo.map((q: { phase: string, releasedAt: string | null }) => `${q.phase}${q.releasedAt ? '+released' : ''}`).sort()).toEqual(['closed+released', 'open', 'upcoming'])

      const student = await signedIn(baseURL, studentEmail)
      const mine = (await student.get('/api/quizzes')).body.items.filter((q: { title: string }) => DEMO_TITLES.test(q.title))
      expect(mine).toHaveLength(3)
      const released = mine.find((q: { feedbackOpen: boolean }) => q.feedbackOpen)
      const detail = (await student.get(`/api/quizzes/${released.id}`)).body
      expect(detail.items.every((i: { feedback?: unknown }) => i.feedback)).toBe(true)
      expect(detail.total.possible).toBeGreaterThan(0)
    }
  })

  it('store released attempts through recordAttempt, with a realistic spread of marks and slips', async () => {
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const week3 = (await tutor.get('/api/quizzes')).body.items.find((q: { title: string }) => q.title === 'Week 3: writing the record')
    const results = (await tutor.get(`/api/quizzes/${week3.id}/results?pageSize=100`)).body
    const sat = results.items.filter((r: { status: string }) => r.status === 'finished')
    expect(sat.length).toBeGreaterThanOrEqual(5)
    const scores = sat.map((r: { score: number }) => r.score)
    expect(Math.max(...scores)).toBeGreaterThan(0.9)
    expect(Math.min(...scores)).toBeLessThan(0.8)
    expect(sat.some((r: { slips: number }) => r.slips > 0)).toBe(true)
    expect(sat.every((r: { timeTakenMs: number }) => r.timeTakenMs > 60_000)).toBe(true)

    const db = readDb(dbPath)
    try {
      const rows = db.all<{ kind: string, read_as: string | null, explanation_json: string | null, n: number }>(
        'SELECT kind, read_as, explanation_json, (SELECT count(*) FROM attempt_slips s WHERE s.attempt_id = a.id) AS n FROM attempts a WHERE quiz_id = ?', week3.id)
      expect(rows.length).toBe(sat.length * 2)
      // columns only recordAttempt fills: the attempts went through it
      expect(rows.every(r => r.kind === 'quiz' && r.read_as && r.explanation_json)).toBe(true)
      const slipCodes = db.all<{ code: string }>('SELECT DISTINCT code FROM attempt_slips WHERE quiz_id = ?', week3.id).map(r => r.code)
      expect(slipCodes).toEqual(expect.arrayContaining(['direction-reversed', 'dial-value-as-amount']))
    }
    finally {
      db.close()
    }
  })
})
