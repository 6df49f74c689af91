// The whole quiz flow over HTTP against the built server: casebook → build →
// assign → sit → autosave → submit → mark → override → release → export.
import Papa from 'papaparse'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import type { Client } from '../support/client'
import { DEMO, signedIn, waitForMail } from '../support/client'
import { correctRecord } from '../support/practice'
import { cohortIds, minutesFromNow, patientFor, publishQuiz } from '../support/quiz'
import { caseSecrets, expectNoCaseSecrets } from '../support/secrecy'
import type { CaseSecrets } from '../support/secrecy'

const baseURL = inject('baseURL')
// a student no other test locks out (auth.test rate-limits Jory, password-reset changes Wen's password)
const OTHER_STUDENT = 'adaeze.quillon@cyclodial.test'
const HERON_STUDENT = 'kofi.ashgrove@cyclodial.test'

/** An exact case: right eye 7° excyclo in primary position, more in downgaze. */
const EXACT_SPEC = {
  condition: 'so-palsy',
  affectedEye: 'RE',
  palsiedMuscles: ['RSO'],
  fixingEye: 'LE',
  gazes: {
    primary: { torsion: { RE: 7, LE: 1 }, vertical: 6, horizontal: -2 },
    down: { torsion: { RE: 9, LE: 1 }, vertical: 4, horizontal: -2 },
  },
  headTilt: { right: 10, left: 2 },
  response: { reliabilitySd: 0.8, parallelThreshold: 1 },
}

// the student's own words echoed back (draft and attempt record) are not the server's to hide
const OWN_INPUT = [/(^|\.)draft\.record$/, /(^|\.)attempt\.record$/, /(^|\.)attempt\.interpretation(\.|$)/]
// counts and ids of the quiz itself (positions, attempts left…) are not case numbers
const QUIZ_COUNTS = [/(^|\.)(itemId|quizId|position|attempts|attemptsLeft|attemptsAllowed|itemCount|timeLimitMinutes)$/]

describe('quizzes: the whole flow', () => {
  let tutor: Client
  let student: Client
  let other: Client
  let admin: Client
  let kestrel: number
  let heron: number
  let quizId: number
  let items: { id: number, position: number, source: any }[]
  let secrets: Record<number, CaseSecrets> = {}
  let myStudentId: number
  const scan = (body: unknown, what: string) => {
    for (const s of Object.values(secrets)) expectNoCaseSecrets(body, s, what, { ignore: OWN_INPUT, allowNumbersAt: QUIZ_COUNTS })
  }

  beforeAll(async () => {
    admin = await signedIn(baseURL, DEMO.admin)
    tutor = await signedIn(baseURL, DEMO.tutor)
    student = await signedIn(baseURL, DEMO.student)
    other = await signedIn(baseURL, OTHER_STUDENT)
    const ids = await cohortIds(admin)
    kestrel = ids['Kestrel cohort']!
    heron = ids['Heron cohort']!
    myStudentId = (await student.get('/api/auth/me')).body.user.id
  })

  it('builds a casebook: a narrowed template and an exact case, with clear refusals', async () => {
    const book = await tutor.get('/api/casebook')
    expect(book.status).toBe(200)
    expect(book.body.engine.map((t: { id: string }) => t.id)).toContain('so-palsy-right-standard')

    const wide = await tutor.post('/api/casebook/templates', { title: 'Wide', templateId: 'so-palsy-right-standard', ranges: { torsion: [2, 8] } })
    expect(wide.status).toBe(400)
    expect(wide.body.data.fields[0]).toMatchObject({ path: 'ranges.torsion', message: expect.stringContaining('4–8') })

    const template = await tutor.post('/api/casebook/templates', { title: 'Clear right SO palsy', templateId: 'so-palsy-right-standard', ranges: { torsion: [5.5, 8] }, tolerance: 1.5 })
    expect(template.status).toBe(201)
    expect(template.body).toMatchObject({ templateId: 'so-palsy-right-standard', ranges: { torsion: [5.5, 8] }, tolerance: 1.5 })

    const impossible = await tutor.post('/api/casebook/cases', { title: 'Bad', spec: { ...EXACT_SPEC, gazes: { primary: { torsion: { RE: 60, LE: 0 } } }, response: { reliabilitySd: -1, parallelThreshold: 1 } } })
    expect(impossible.status).toBe(400)
    const paths = impossible.body.data.fields.map((f: { path: string }) => f.path)
    expect(paths).toEqual(expect.arrayContaining(['spec.gazes.primary.torsion.RE', 'spec.response.reliabilitySd']))
    expect(impossible.body.data.fields.find((f: { path: string }) => f.path === 'spec.gazes.primary.torsion.RE').message).toMatch(/45°/)

    const exact = await tutor.post('/api/casebook/cases', { title: 'Exact right SO palsy', spec: EXACT_SPEC, tolerance: 2 })
    expect(exact.status).toBe(201)

    const preview = await tutor.post('/api/casebook/preview', { source: { type: 'case', id: exact.body.id }, mode: 'learner-turns' })
    expect(preview.status).toBe(200)
    expect(preview.body.truth.torsion).toEqual({ RE: 7, LE: 1 })
    // the presentation half is exactly what a student gets: no truth in it
    expectNoCaseSecrets(preview.body.presentation, caseSecrets(patientFor({ source: { type: 'case' } }, '', EXACT_SPEC)), 'preview presentation')

    // another tutor's casebook is not yours to use
    const tutor2 = await signedIn(baseURL, DEMO.tutor2)
    const borrowed = await tutor2.post('/api/quizzes', { title: 'Borrow' })
    const refused = await tutor2.post(`/api/quizzes/${borrowed.body.id}/items`, { kind: 'dmr', source: { type: 'template', id: template.body.id } })
    expect(refused.status).toBe(400)
    expect(refused.body.data.fields[0].path).toBe('source')
  })

  it('builds, assigns and publishes a two-item quiz; only its own cohort may be assigned', async () => {
    const book = (await tutor.get('/api/casebook')).body
    const template = book.templates.find((t: { title: string }) => t.title === 'Clear right SO palsy')
    const exact = book.cases.find((c: { title: string }) => c.title === 'Exact right SO palsy')

    const notMine = await tutor.post('/api/quizzes', { title: 'X', cohortIds: [heron] })
    expect(notMine.status).toBe(400)
    expect(notMine.body.data.fields[0].path).toBe('cohortIds')
    const backwards = await tutor.post('/api/quizzes', { title: 'X', opensAt: minutesFromNow(10), closesAt: minutesFromNow(5) })
    expect(backwards.status).toBe(400)
    expect(backwards.body.data.fields[0].path).toBe('closesAt')
    const badWeights = await tutor.post('/api/quizzes', { title: 'X' })
    const weightProblem = await tutor.post(`/api/quizzes/${badWeights.body.id}/items`, { kind: 'dmr', source: { type: 'engine', templateId: 'normal-standard' }, weights: { colour: 2 } })
    expect(weightProblem.status).toBe(400)
    expect(weightProblem.body.message).toMatch(/Criteria are/)
    const incomplete = await tutor.patch(`/api/quizzes/${badWeights.body.id}`, { published: true })
    expect(incomplete.status).toBe(400)
    expect(incomplete.body.data.fields.map((f: { path: string }) => f.path)).toEqual(expect.arrayContaining(['published', 'cohortIds', 'opensAt', 'closesAt']))

    const quiz = await publishQuiz(tutor, {
      title: 'Week 6 record check',
      instructions: 'Measure in primary position at near and record what you find.',
      opensAt: minutesFromNow(-5),
      closesAt: minutesFromNow(60),
      timeLimitMinutes: 45,
      attemptsAllowed: 1,
      interpretation: true,
      cohortIds: [kestrel],
    }, [
      { kind: 'dmr', prompt: 'Patient A: measure in primary position at near.', source: { type: 'template', id: template.id }, perStudent: true, mode: 'patient-turns', weights: { distance: 0 } },
      { kind: 'dmr', prompt: 'Patient B: measure in primary position at near.', source: { type: 'case', id: exact.id }, mode: 'learner-turns' },
    ])
    quizId = quiz.id
    items = quiz.items
    expect(items.map(i => i.position)).toEqual([1, 2])
    expect(quiz.items[0]).toMatchObject({ perStudent: true, tolerance: 1.5, weights: { distance: 0, measurement: 2 } })
    // an exact case is one patient for everyone
    expect(quiz.items[1]).toMatchObject({ perStudent: false, tolerance: 2 })
    expect(quiz.phase).toBe('open')

    // another cohort's tutor can neither see nor change it
    const tutor2 = await signedIn(baseURL, DEMO.tutor2)
    expect((await tutor2.get(`/api/quizzes/${quizId}`)).status).toBe(404)
    expect((await tutor2.patch(`/api/quizzes/${quizId}`, { title: 'Mine now' })).status).toBe(404)
    expect((await tutor2.get(`/api/quizzes/${quizId}/results`)).status).toBe(404)
    expect((await tutor2.get('/api/quizzes')).body.items.map((q: { id: number }) => q.id)).not.toContain(quizId)
    // the lecturer sees every quiz
    const lecturer = await signedIn(baseURL, DEMO.lecturer)
    expect((await lecturer.get('/api/quizzes')).body.items.map((q: { id: number }) => q.id)).toContain(quizId)
  })

  it('lists the quiz to its students only, and starts a sitting with a server deadline', async () => {
    const list = await student.get('/api/quizzes')
    const mine = list.body.items.find((q: { id: number }) => q.id === quizId)
    expect(mine).toMatchObject({ phase: 'open', itemCount: 2, sitting: { status: 'not-started' } })
    scan(list.body, 'student quiz list')

    const heronStudent = await signedIn(baseURL, HERON_STUDENT)
    expect((await heronStudent.get('/api/quizzes')).body.items.map((q: { id: number }) => q.id)).not.toContain(quizId)
    expect((await heronStudent.get(`/api/quizzes/${quizId}`)).status).toBe(404)
    expect((await heronStudent.post(`/api/quizzes/${quizId}/start`)).status).toBe(404)

    expect((await student.get(`/api/quizzes/${quizId}/items/${items[0]!.id}`)).status).toBe(409)
    const started = await student.post(`/api/quizzes/${quizId}/start`)
    expect(started.status).toBe(200)
    expect(started.body.sitting.status).toBe('in-progress')
    const deadline = Date.parse(started.body.sitting.deadline)
    const start = Date.parse(started.body.sitting.startedAt)
    expect(deadline - start).toBe(45 * 60_000)
    // starting again changes nothing
    const again = await student.post(`/api/quizzes/${quizId}/start`)
    expect(again.body.sitting.startedAt).toBe(started.body.sitting.startedAt)
    await other.post(`/api/quizzes/${quizId}/start`)

    // the tutor opens exactly what each student sees, and the two students' patients differ
    const joryId = (await other.get('/api/auth/me')).body.user.id
    const views = await Promise.all([myStudentId, joryId].map(sid => tutor.get(`/api/quizzes/${quizId}/items/${items[0]!.id}/cases/${sid}`)))
    expect(views.map(v => v.body.stored)).toEqual([true, true])
    expect(views[0]!.body.seed).not.toBe(views[1]!.body.seed)
    const mineItem = await student.get(`/api/quizzes/${quizId}/items/${items[0]!.id}`)
    expect(mineItem.body.presentation).toEqual(views[0]!.body.presentation)
    // the narrowed template held: 5.5–8° in the affected (right) eye
    expect(views[0]!.body.truth.objectiveTorsion.RE).toBeGreaterThanOrEqual(5.5)
    expect(views[0]!.body.truth.objectiveTorsion.RE).toBeLessThanOrEqual(8)
    secrets = {
      [items[0]!.id]: caseSecrets(patientFor(items[0]!, views[0]!.body.seed)),
      [items[1]!.id]: caseSecrets(patientFor(items[1]!, '', EXACT_SPEC)),
    }
    scan(started.body, 'start')
    scan(mineItem.body, 'item 1')
    const joryTruth = caseSecrets(patientFor(items[0]!, views[1]!.body.seed))
    expectNoCaseSecrets(mineItem.body, joryTruth, 'item 1 against the other student\'s case', { allowNumbersAt: QUIZ_COUNTS })
  })

  it('autosaves every change on the server and returns it on reload', async () => {
    const item = items[0]!
    const draft = { gaze: 'primary', distance: 'near', readings: { RE: 97, LE: 89 }, prisms: [{ eye: 'RE', power: 4, base: 'down' }], lights: 'dim', record: 'DMR near primary RE 7 ex' }
    const saved = await student.put(`/api/quizzes/${quizId}/items/${item.id}/draft`, draft)
    expect(saved.status).toBe(200)
    const bad = await student.put(`/api/quizzes/${quizId}/items/${item.id}/draft`, { ...draft, readings: { RE: 200, LE: 89 } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields[0].path).toBe('readings.RE')
    const reload = await student.get(`/api/quizzes/${quizId}/items/${item.id}`)
    expect(reload.body.draft).toMatchObject(draft)
    expect(reload.body.draft.savedAt).toBe(saved.body.savedAt)
    scan(reload.body, 'item after autosave')
  })

  it('takes submissions without feedback, once per item, and hides every answer before release', async () => {
    const [patientTurns, learnerTurns] = items as [typeof items[0], typeof items[0]]
    const turn = await student.post(`/api/quizzes/${quizId}/items/${patientTurns.id}/turns`, { gaze: 'primary', distance: 'near' })
    expect(turn.status).toBe(200)
    expect(turn.body.trial).toBe(1)
    scan(turn.body, 'turn')

    const view = (await tutor.get(`/api/quizzes/${quizId}/items/${patientTurns.id}/cases/${myStudentId}`)).body
    const patient = patientFor(patientTurns, view.seed)
    const submitted = await student.post(`/api/quizzes/${quizId}/items/${patientTurns.id}/attempts`, {
      gaze: 'primary',
      distance: 'near',
      readings: { RE: Math.round(turn.body.readings.RE), LE: Math.round(turn.body.readings.LE) },
      record: correctRecord(patient),
      trial: 1,
      interpretation: { higherEye: 'RE', worseGaze: 'left', worseTilt: 'right', muscle: 'RSO' },
    })
    expect(submitted.status).toBe(201)
    expect(Object.keys(submitted.body).sort()).toEqual(['attemptId', 'attemptsLeft', 'message', 'submittedAt'])
    expect(submitted.body.message).toMatch(/when your tutor releases/)
    scan(submitted.body, 'submit receipt')

    const twice = await student.post(`/api/quizzes/${quizId}/items/${patientTurns.id}/attempts`, { gaze: 'primary', distance: 'near', readings: { RE: 90, LE: 90 }, record: 'x', trial: 1 })
    expect(twice.status).toBe(409)
    expect(twice.body.message).toMatch(/already submitted/)

    // learner-turns: set each dial where the line looks level, and record it (tutor's truth gives where)
    const exactView = (await tutor.get(`/api/quizzes/${quizId}/items/${learnerTurns.id}/cases/${myStudentId}`)).body
    const second = await student.post(`/api/quizzes/${quizId}/items/${learnerTurns.id}/attempts`, {
      gaze: 'primary',
      distance: 'near',
      readings: exactView.truth.levelAt,
      record: 'DMR near primary position RE 7 degrees excyclotorsion LE 1 degree excyclotorsion',
    })
    expect(second.status).toBe(201)

    const detail = await student.get(`/api/quizzes/${quizId}`)
    expect(detail.body.feedbackOpen).toBe(false)
    expect(detail.body.items.map((i: { attempts: number, feedback?: unknown }) => [i.attempts, i.feedback])).toEqual([[1, undefined], [1, undefined]])
    expect(detail.body.total).toBeUndefined()
    scan(detail.body, 'quiz detail before release')

    const own = await student.get(`/api/quizzes/${quizId}/attempts/${submitted.body.attemptId}`)
    expect(own.status).toBe(200)
    expect(own.body.result).toBeNull()
    expect(own.body.attempt.readings).toEqual({ RE: Math.round(turn.body.readings.RE), LE: Math.round(turn.body.readings.LE) })
    scan(own.body, 'own attempt before release')

    // another student's attempt is not there for you
    expect((await other.get(`/api/quizzes/${quizId}/attempts/${submitted.body.attemptId}`)).status).toBe(404)
    // nor through the practice API
    expect((await student.get(`/api/practice/attempts/${submitted.body.attemptId}`)).status).toBe(404)
    expect((await student.get(`/api/practice/${view.caseId}`)).status).toBe(404)
  })

  it('shows the tutor a results table to sort, filter and page, and every attempt as the student left it', async () => {
    const results = await tutor.get(`/api/quizzes/${quizId}/results?sort=total&dir=desc`)
    expect(results.status).toBe(200)
    expect(results.body.columns.map((c: { position: number }) => c.position)).toEqual([1, 2])
    const first = results.body.columns[0]
    // distance weighted 0 does not count; the interpretation does
    expect(first.criteria.map((c: { criterion: string }) => c.criterion)).not.toContain('distance')
    expect(first.criteria.map((c: { criterion: string }) => c.criterion)).toContain('interpretation')
    const me = results.body.items[0]
    expect(me.studentId).toBe(myStudentId)
    expect(me.earned).toBeGreaterThan(0)
    expect(me.items[items[0]!.id].attemptId).toBeTypeOf('number')
    expect(me.timeTakenMs).toBeGreaterThanOrEqual(0)
    expect(results.body.total).toBeGreaterThanOrEqual(6)

    const search = await tutor.get(`/api/quizzes/${quizId}/results?q=quillon`)
    expect(search.body.items.map((r: { email: string }) => r.email)).toEqual([OTHER_STUDENT])
    expect(search.body.items[0].status).toBe('in-progress')
    expect(search.body.items[0].items[items[0]!.id].attemptId).toBeNull()
    const notStarted = await tutor.get(`/api/quizzes/${quizId}/results?status=not-started&pageSize=5`)
    expect(notStarted.body.items.every((r: { status: string }) => r.status === 'not-started')).toBe(true)
    const paged = await tutor.get(`/api/quizzes/${quizId}/results?sort=name&pageSize=5&page=2`)
    expect(paged.body.page).toBe(2)
    const byName = (await tutor.get(`/api/quizzes/${quizId}/results?sort=name&pageSize=100`)).body.items.map((r: { name: string }) => r.name)
    expect(byName).toEqual([...byName].sort((a: string, b: string) => a.localeCompare(b)))
    expect((await tutor.get(`/api/quizzes/${quizId}/results?sort=password`)).status).toBe(400)

    const attemptId = me.items[items[0]!.id].attemptId
    const opened = await tutor.get(`/api/quizzes/${quizId}/attempts/${attemptId}`)
    expect(opened.status).toBe(200)
    expect(opened.body.attempt).toMatchObject({ gaze: 'primary', distance: 'near', trial: 1, lights: 'dim' })
    expect(opened.body.turn.trial).toBe(1)
    expect(opened.body.result.marks.map((m: { criterion: string }) => m.criterion)).toEqual(expect.arrayContaining(['measurement', 'direction', 'amount', 'eye', 'test', 'gaze', 'interpretation']))
    expect(opened.body.result.truth.condition).toBe('so-palsy')
  })

  it('overrides a mark with a reason, audit-logged, and the total follows', async () => {
    const before = (await tutor.get(`/api/quizzes/${quizId}/results?q=arkwell`)).body.items[0]
    const attemptId = before.items[items[1]!.id].attemptId
    const noReason = await tutor.post(`/api/quizzes/${quizId}/attempts/${attemptId}/overrides`, { criterion: 'test', score: 0, reason: '' })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.fields[0].path).toBe('reason')
    const outOfRange = await tutor.post(`/api/quizzes/${quizId}/attempts/${attemptId}/overrides`, { criterion: 'test', score: 2, reason: 'Too generous' })
    expect(outOfRange.body.data.fields[0].path).toBe('score')

    const test = before.items[items[1]!.id].marks.find((m: { criterion: string }) => m.criterion === 'test')
    const changed = await tutor.post(`/api/quizzes/${quizId}/attempts/${attemptId}/overrides`, { criterion: 'test', score: 0, reason: 'Wrote DMR without saying near or distance in full' })
    expect(changed.status).toBe(201)
    const mark = changed.body.result.marks.find((m: { criterion: string }) => m.criterion === 'test')
    expect(mark).toMatchObject({ score: 0, overridden: true })
    const after = (await tutor.get(`/api/quizzes/${quizId}/results?q=arkwell`)).body.items[0]
    expect(after.earned).toBeCloseTo(before.earned - test.score * test.weight, 6)
    expect(after.items[items[1]!.id].overridden).toBe(true)

    const audit = (await admin.get('/api/admin/audit?pageSize=100')).body.items
    const entry = audit.find((e: { action: string, target: string }) => e.action === 'quiz.mark-overridden' && e.target === `attempt ${attemptId}`)
    expect(entry.detail).toMatchObject({ criterion: 'test', from: test.score, to: 0, reason: 'Wrote DMR without saying near or distance in full' })
  })

  it('refuses release while open; after close refuses late work, releases, e-mails and opens feedback', async () => {
    const early = await tutor.post(`/api/quizzes/${quizId}/release`)
    expect(early.status).toBe(409)
    expect(early.body.message).toMatch(/still open/)

    const joryDraft = { gaze: 'primary', distance: 'near', readings: { RE: 95, LE: 90 }, record: 'RE 5 ex' }
    expect((await other.put(`/api/quizzes/${quizId}/items/${items[0]!.id}/draft`, joryDraft)).status).toBe(200)

    const closed = await tutor.patch(`/api/quizzes/${quizId}`, { closesAt: minutesFromNow(-0.01) })
    expect(closed.status).toBe(200)
    expect(closed.body.phase).toBe('closed')

    const late = await other.post(`/api/quizzes/${quizId}/items/${items[1]!.id}/attempts`, { gaze: 'primary', distance: 'near', readings: { RE: 97, LE: 89 }, record: 'DMR near primary RE 7 ex' })
    expect([403, 409]).toContain(late.status)
    expect(late.body.message).toMatch(/Time is up/)
    const lateSave = await other.put(`/api/quizzes/${quizId}/items/${items[0]!.id}/draft`, { ...joryDraft, record: 'changed after the deadline' })
    expect(lateSave.status).toBe(409)
    const joryId = (await other.get('/api/auth/me')).body.user.id
    const kept = await tutor.get(`/api/quizzes/${quizId}/items/${items[0]!.id}/cases/${joryId}`)
    expect(kept.body.draft.record).toBe('RE 5 ex')

    const released = await tutor.post(`/api/quizzes/${quizId}/release`)
    expect(released.status).toBe(200)
    expect(released.body.message).toMatch(/e-mailed/)
    const mail = await waitForMail(admin, DEMO.student, /Results released: Week 6 record check/)
    expect(mail.text).toContain(`/student/quizzes/${quizId}`)

    const detail = await student.get(`/api/quizzes/${quizId}`)
    expect(detail.body.feedbackOpen).toBe(true)
    const fb = detail.body.items[0].feedback
    expect(fb.truth.condition).toBe('so-palsy')
    expect(fb.modelRecord).toMatch(/DMR, near, primary position: RE \d+° excyclotorsion/)
    expect(fb.marks.find((m: { criterion: string }) => m.criterion === 'interpretation').score).toBe(1)
    expect(detail.body.items[1].feedback.marks.find((m: { criterion: string }) => m.criterion === 'test')).toMatchObject({ score: 0, overridden: true })
    expect(detail.body.total.possible).toBeGreaterThan(0)
    const tutorRow = (await tutor.get(`/api/quizzes/${quizId}/results?q=arkwell`)).body.items[0]
    expect(detail.body.total.earned).toBeCloseTo(tutorRow.earned, 6)
  })

  it('exports a CSV with one row per student and a column per item and criterion', async () => {
    const csv = await tutor.request('GET', `/api/quizzes/${quizId}/results.csv`, undefined, { headers: { accept: 'text/csv' } })
    expect(csv.status).toBe(200)
    expect(csv.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(csv.headers.get('content-disposition')).toMatch(/attachment; filename=".*\.csv"/)
    const rows = Papa.parse<string[]>(String(csv.body).replace(/^\uFEFF/, '').trim()).data
    const header = rows[0]!
    expect(header.slice(0, 3)).toEqual(['Student', 'E-mail', 'Cohort'])
    expect(header).toEqual(expect.arrayContaining(['Item 1 total', 'Item 1 measurement', 'Item 1 interpretation', 'Item 2 total', 'Item 2 test named', 'Total points', 'Total %']))
    expect(header).not.toContain('Item 1 fixation distance')
    const results = (await tutor.get(`/api/quizzes/${quizId}/results?pageSize=100`)).body
    expect(rows.length - 1).toBe(results.total)
    const mine = rows.find(r => r[1] === DEMO.student)!
    const tutorRow = results.items.find((r: { email: string }) => r.email === DEMO.student)
    expect(Number(mine[header.indexOf('Total points')])).toBeCloseTo(tutorRow.earned, 2)
    expect(Number(mine[header.indexOf('Item 2 test named')])).toBe(0)
    // a student cannot export
    expect((await student.get(`/api/quizzes/${quizId}/results.csv`)).status).toBe(403)
  })

  it('duplicates a quiz as a fresh draft and archives one', async () => {
    const copy = await tutor.post(`/api/quizzes/${quizId}/duplicate`)
    expect(copy.status).toBe(201)
    expect(copy.body).toMatchObject({ title: 'Copy of Week 6 record check', published: false, locked: false, itemCount: 2 })
    expect(copy.body.cohorts.map((c: { id: number }) => c.id)).toEqual([kestrel])
    // its items may change; the original's may not
    expect((await tutor.delete(`/api/quizzes/${copy.body.id}/items/${copy.body.items[0].id}`)).status).toBe(200)
    const locked = await tutor.delete(`/api/quizzes/${quizId}/items/${items[0]!.id}`)
    expect(locked.status).toBe(409)
    expect(locked.body.message).toMatch(/Duplicate it/)

    expect((await tutor.patch(`/api/quizzes/${copy.body.id}`, { archived: true })).body.archived).toBe(true)
    expect((await tutor.get('/api/quizzes')).body.items.map((q: { id: number }) => q.id)).not.toContain(copy.body.id)
    expect((await tutor.get('/api/quizzes?archived=1')).body.items.map((q: { id: number }) => q.id)).toContain(copy.body.id)
  })
})
