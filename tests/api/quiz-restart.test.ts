// Killing the server mid-quiz loses no autosaved work: start the built server on
// a database file, autosave, kill it (SIGKILL), start it again on the same file.
import { once } from 'node:events'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { DEMO, signedIn } from '../support/client'
import { cohortIds, minutesFromNow, publishQuiz } from '../support/quiz'
import { startServer } from '../support/server'
import type { RunningServer } from '../support/server'

describe('autosave across a server restart', () => {
  const dir = mkdtempSync(join(tmpdir(), 'cyclodial-restart-'))
  const dbPath = join(dir, 'cyclodial.sqlite')
  let server: RunningServer | undefined
  afterAll(async () => {
    await server?.stop()
    rmSync(dir, { recursive: true, force: true })
  })

  it('keeps the draft, the patient\'s turns and the deadline', async () => {
    server = await startServer({ dbPath })
    const admin = await signedIn(server.baseURL, DEMO.admin)
    const tutor = await signedIn(server.baseURL, DEMO.tutor)
    const quiz = await publishQuiz(tutor, {
      title: 'Restart check',
      opensAt: minutesFromNow(-1),
      closesAt: minutesFromNow(60),
      timeLimitMinutes: 30,
      cohortIds: [(await cohortIds(admin))['Kestrel cohort']],
    }, [{ kind: 'dmr', source: { type: 'engine', templateId: 'so-palsy-left-standard' }, mode: 'patient-turns' }])
    const item = quiz.items[0]!
    let student = await signedIn(server.baseURL, DEMO.student)
    const started = (await student.post(`/api/quizzes/${quiz.id}/start`)).body
    const turn = (await student.post(`/api/quizzes/${quiz.id}/items/${item.id}/turns`, { gaze: 'down', distance: 'near' })).body
    const draft = { gaze: 'down', distance: 'near', readings: turn.readings, prisms: [], lights: 'dim', record: 'DMR near downgaze: LE 6° ex' }
    const saved = await student.put(`/api/quizzes/${quiz.id}/items/${item.id}/draft`, draft)
    expect(saved.status).toBe(200)
    const before = (await student.get(`/api/quizzes/${quiz.id}/items/${item.id}`)).body

    // kill it outright, as a crash or a pulled plug on the server process would
    const exited = once(server.process, 'exit')
    server.process.kill('SIGKILL')
    await exited
    server = await startServer({ dbPath })
    student = await signedIn(server.baseURL, DEMO.student)
    const after = (await student.get(`/api/quizzes/${quiz.id}/items/${item.id}`)).body
    expect(after.draft).toEqual({ ...draft, savedAt: saved.body.savedAt })
    expect(after.turns).toEqual([turn])
    expect(after.presentation).toEqual(before.presentation)
    expect(after.deadline).toBe(started.sitting.deadline)
    // and the work can still be submitted after the restart
    const submitted = await student.post(`/api/quizzes/${quiz.id}/items/${item.id}/attempts`, { ...draft, trial: turn.trial })
    expect(submitted.status).toBe(201)
  })
})
