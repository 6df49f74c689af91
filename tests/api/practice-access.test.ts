// Practice ownership (another student → 404, stranger → 401) and bad input
// (→ 400 naming the fields, nothing stored).
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { Client, DEMO, signedIn } from '../support/client'
import { readDb } from '../support/db'

const baseURL = inject('baseURL')
const db = readDb(inject('dbPath'))
afterAll(() => db.close())

let owner: Client
let other: Client
let caseId: number
let attemptId: number
const attempt = { gaze: 'primary', distance: 'near', readings: { RE: 95, LE: 90 }, record: 'DMR N PP: RE 5 ex, LE nil' }

beforeAll(async () => {
  owner = await signedIn(baseURL, DEMO.student)
  other = await signedIn(baseURL, 'freya.dunmoor@cyclodial.test')
  caseId = (await owner.post('/api/practice', { template: 'so-palsy-right', mode: 'patient-turns' })).body.id
  await owner.put(`/api/practice/${caseId}/draft`, { ...attempt, record: 'mine' })
  await owner.post(`/api/practice/${caseId}/turns`, { gaze: 'primary', distance: 'near' })
  attemptId = (await owner.post(`/api/practice/${caseId}/attempts`, { ...attempt, trial: 1 })).body.attemptId
  expect(attemptId).toBeGreaterThan(0)
})

const fields = (r: { body: { data: { fields: { path: string }[] } } }) => r.body.data.fields.map(f => f.path)

describe('ownership', () => {
  it('answers 404 to another student for every route on my case and attempt, and changes nothing', async () => {
    const turns = db.count('SELECT count(*) AS n FROM case_turns WHERE case_id = ?', caseId)
    const attempts = db.count('SELECT count(*) AS n FROM attempts WHERE case_id = ?', caseId)
    expect((await other.get(`/api/practice/${caseId}`)).status).toBe(404)
    expect((await other.put(`/api/practice/${caseId}/draft`, attempt)).status).toBe(404)
    expect((await other.post(`/api/practice/${caseId}/turns`, { gaze: 'primary', distance: 'near' })).status).toBe(404)
    expect((await other.post(`/api/practice/${caseId}/attempts`, { ...attempt, trial: 1 })).status).toBe(404)
    expect((await other.get(`/api/practice/attempts/${attemptId}`)).status).toBe(404)
    const like = await other.post('/api/practice', { like: caseId })
    expect(like.status).toBe(400)
    expect(fields(like)).toEqual(['like'])
    const history = (await other.get('/api/practice/history?pageSize=100')).body
    expect(history.items.some((i: { caseId: number }) => i.caseId === caseId)).toBe(false)

    expect(db.count('SELECT count(*) AS n FROM case_turns WHERE case_id = ?', caseId)).toBe(turns)
    expect(db.count('SELECT count(*) AS n FROM attempts WHERE case_id = ?', caseId)).toBe(attempts)
    expect(JSON.parse(db.get<{ draft_json: string }>('SELECT draft_json FROM cases WHERE id = ?', caseId)!.draft_json).record).toBe('mine')
  })

  it('answers 404 to a tutor for a student\'s practice case (staff see their own practice only)', async () => {
    const tutor = await signedIn(baseURL, DEMO.tutor)
    expect((await tutor.get(`/api/practice/${caseId}`)).status).toBe(404)
    expect((await tutor.get(`/api/practice/attempts/${attemptId}`)).status).toBe(404)
  })

  it('answers 401 to a stranger', async () => {
    const stranger = new Client(baseURL)
    expect((await stranger.get('/api/practice/templates')).status).toBe(401)
    expect((await stranger.post('/api/practice', {})).status).toBe(401)
    expect((await stranger.get(`/api/practice/${caseId}`)).status).toBe(401)
    expect((await stranger.put(`/api/practice/${caseId}/draft`, attempt)).status).toBe(401)
    expect((await stranger.post(`/api/practice/${caseId}/turns`, { gaze: 'primary', distance: 'near' })).status).toBe(401)
    expect((await stranger.post(`/api/practice/${caseId}/attempts`, attempt)).status).toBe(401)
    expect((await stranger.get('/api/practice/history')).status).toBe(401)
    expect((await stranger.get(`/api/practice/attempts/${attemptId}`)).status).toBe(401)
    expect((await stranger.post('/api/record-check', { torsion: { RE: 0, LE: 0 }, record: 'x' })).status).toBe(401)
  })

  it('a case that does not exist is 404, an id that is not a number 400', async () => {
    expect((await owner.get('/api/practice/99999999')).status).toBe(404)
    const bad = await owner.get('/api/practice/abc')
    expect(bad.status).toBe(400)
    expect(fields(bad)).toEqual(['id'])
    expect(fields(await owner.get('/api/practice/attempts/0'))).toEqual(['attemptId'])
  })
})

describe('bad input', () => {
  it('refuses a bad start naming each field, and stores no case', async () => {
    const before = db.count('SELECT count(*) AS n FROM cases')
    const unknown = await owner.post('/api/practice', { template: 'no-such-condition' })
    expect(unknown.status).toBe(400)
    expect(fields(unknown)).toEqual(['template'])
    const several = await owner.post('/api/practice', { template: 'Bad Id!', mode: 'examiner-turns', difficulty: 'hard', seed: '', readScale: 'yes' })
    expect(several.status).toBe(400)
    expect(fields(several)).toEqual(expect.arrayContaining(['template', 'mode', 'difficulty', 'seed', 'readScale']))
    expect(several.body.message).toMatch(/mode: Mode must be "learner-turns" or "patient-turns"/)
    expect(fields(await owner.post('/api/practice', { template: 'normal', like: caseId }))).toEqual(['template'])
    expect(fields(await owner.post('/api/practice', { template: 'normal-standard', difficulty: 'challenging' }))).toEqual(['template'])
    expect(fields(await owner.post('/api/practice', { template: 'normal', harder: true, difficulty: 'standard' }))).toEqual(['harder'])
    const malformed = await owner.request('POST', '/api/practice', undefined, { raw: '{"template":' })
    expect(malformed.status).toBe(400)
    expect(malformed.body.data.code).toBe('malformed-json')
    expect(db.count('SELECT count(*) AS n FROM cases')).toBe(before)
  })

  it('refuses a bad attempt naming each field, and stores nothing', async () => {
    const c = (await owner.post('/api/practice', { template: 'normal' })).body
    const r = await owner.post(`/api/practice/${c.id}/attempts`, { gaze: 'sideways', distance: 'far', readings: { RE: 200 }, prisms: [{ eye: 'XE', power: -1, base: 'up' }], record: 42 })
    expect(r.status).toBe(400)
    expect(fields(r)).toEqual(expect.arrayContaining(['gaze', 'distance', 'readings.RE', 'readings.LE', 'prisms.0.eye', 'prisms.0.power', 'record']))
    expect(JSON.stringify(r.body)).not.toMatch(/at .*\.(js|mjs|ts):\d+/)
    const long = await owner.post(`/api/practice/${c.id}/attempts`, { ...attempt, record: 'x'.repeat(2001) })
    expect(fields(long)).toEqual(['record'])
    expect(db.count('SELECT count(*) AS n FROM attempts WHERE case_id = ?', c.id)).toBe(0)
    expect(db.count('SELECT count(*) AS n FROM attempt_slips s JOIN attempts a ON a.id = s.attempt_id WHERE a.case_id = ?', c.id)).toBe(0)
  })

  it('refuses a bad draft and a bad turn, keeping what was there', async () => {
    const c = (await owner.post('/api/practice', { template: 'normal', mode: 'patient-turns' })).body
    await owner.put(`/api/practice/${c.id}/draft`, { ...attempt, record: 'first' })
    const bad = await owner.put(`/api/practice/${c.id}/draft`, { gaze: 'primary', distance: 'near', readings: { RE: 'ninety', LE: 90 }, lights: 'bright' })
    expect(bad.status).toBe(400)
    expect(fields(bad)).toEqual(expect.arrayContaining(['readings.RE', 'lights']))
    expect((await owner.get(`/api/practice/${c.id}`)).body.draft.record).toBe('first')

    const turn = await owner.post(`/api/practice/${c.id}/turns`, { gaze: 'primary', prisms: [{ eye: 'RE', power: 80, base: 'down' }] })
    expect(turn.status).toBe(400)
    expect(fields(turn)).toEqual(expect.arrayContaining(['distance', 'prisms.0.power']))
    expect(db.get('SELECT trial_count FROM cases WHERE id = ?', c.id)).toEqual({ trial_count: 0 })
  })

  it('refuses bad history queries', async () => {
    const r = await owner.get('/api/practice/history?page=0&pageSize=500&template=NOPE')
    expect(r.status).toBe(400)
    expect(fields(r)).toEqual(expect.arrayContaining(['page', 'pageSize', 'template']))
  })
})
