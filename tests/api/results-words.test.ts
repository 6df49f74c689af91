// Issue 13 over HTTP: the results say what releasing would do (students e-mailed,
// those who never sat included), the mean counts only those who finished (none yet:
// null, not 0), and the audit log reads in words with old → new for a quiz change.
import { beforeAll, describe, expect, inject, it } from 'vitest'
import type { Client } from '../support/client'
import { DEMO, signedIn } from '../support/client'
import { cohortIds, minutesFromNow, publishQuiz } from '../support/quiz'

const baseURL = inject('baseURL')

describe('results and audit in words', () => {
  let admin: Client
  let tutor: Client
  let kestrel: number

  beforeAll(async () => {
    admin = await signedIn(baseURL, DEMO.admin)
    tutor = await signedIn(baseURL, DEMO.tutor)
    kestrel = (await cohortIds(admin))['Kestrel cohort']!
  })

  it('tells whoever may release how many students would be e-mailed; the mean waits for a finisher', async () => {
    const quiz = await publishQuiz(tutor, { title: 'Words: release count', opensAt: minutesFromNow(-5), closesAt: minutesFromNow(60), cohortIds: [kestrel] }, [
      { kind: 'dmr', prompt: 'P', source: { type: 'engine', templateId: 'normal-standard' } },
    ])
    const kestrelStudents = (await admin.get(`/api/admin/users?role=student&cohortId=${kestrel}&pageSize=100`)).body.total as number
    const res = await tutor.get(`/api/quizzes/${quiz.id}/results`)
    expect(res.status).toBe(200)
    expect(res.body.release).toEqual({ students: kestrelStudents, neverSat: kestrelStudents })
    expect(res.body.summary).toMatchObject({ students: kestrelStudents, started: 0, finished: 0, meanScore: null })
    for (const row of res.body.items) expect(row.status).toBe('not-started')
    // once released there is nothing more to tell
    expect((await tutor.patch(`/api/quizzes/${quiz.id}`, { closesAt: minutesFromNow(-1) })).status).toBe(200)
    expect((await tutor.post(`/api/quizzes/${quiz.id}/release`)).status).toBe(200)
    expect((await tutor.get(`/api/quizzes/${quiz.id}/results`)).body.release).toBeNull()
  })

  it('writes a quiz change old → new and shows the audit log in words', async () => {
    const quiz = (await tutor.post('/api/quizzes', { title: 'Words: audit', timeLimitMinutes: 30 })).body
    expect((await tutor.patch(`/api/quizzes/${quiz.id}`, { timeLimitMinutes: 45, title: 'Words: audit, renamed' })).status).toBe(200)
    const rows = (await admin.get('/api/admin/audit?pageSize=100')).body.items as { action: string, target: string, detail: any, words: { action: string, target: string, changes: string[] } }[]
    const changed = rows.find(r => r.action === 'quiz.updated' && r.target === `quiz ${quiz.id}`)!
    expect(changed.detail.previous).toMatchObject({ time_limit_minutes: 30, title: 'Words: audit' })
    expect(changed.words).toEqual({
      action: 'Quiz changed',
      target: 'quiz “Words: audit, renamed”',
      changes: expect.arrayContaining(['Time limit: 30 min → 45 min', 'Title: “Words: audit” → “Words: audit, renamed”']),
    })
    for (const r of rows) {
      expect(r.words.action, r.action).not.toMatch(/[._]/)
      for (const line of r.words.changes) expect(line, r.action).not.toMatch(/[{}]/)
    }
  })
})
