// The secrecy boundary over HTTP: every response that carries a case before its
// truth is due — POST /api/practice, GET /api/practice/:id before any attempt,
// POST …/turns, PUT …/draft — is scanned for every template × both modes × a few
// seeds, with the template chosen (named) and with "any" (hidden).
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { MODES } from '#shared/engine/types'
import { generateCase } from '~~/server/lib/engine/generator'
import { CASE_TEMPLATES } from '~~/server/lib/engine/templates'
import type { Client } from '../support/client'
import { DEMO, signedIn } from '../support/client'
import { readDb } from '../support/db'
import type { CaseSecrets, ScanOptions } from '../support/secrecy'
import { caseSecrets, expectNoCaseSecrets, findCaseSecrets } from '../support/secrecy'

const baseURL = inject('baseURL')
const db = readDb(inject('dbPath'))
afterAll(() => db.close())
const SEEDS = ['s-1', 'quiz-7', '42']

let student: Client
beforeAll(async () => {
  student = await signedIn(baseURL, DEMO.student)
})

// A realistic draft: the learner's own record is echoed back, so it is not scanned.
const draft = { gaze: 'down', distance: 'near', readings: { RE: 96, LE: 88 }, prisms: [{ eye: 'RE', power: 6, base: 'down' }], lights: 'dim', record: 'DMR near downgaze: RE 6° excyclotorsion, LE 2° excyclo' }
const OWN_INPUT: RegExp[] = [/^draft\.(record|interpretation)/]

/** Every case-carrying response before the truth is due, for one case. */
async function scanCase(created: any, secrets: CaseSecrets, options: ScanOptions) {
  const what = (route: string) => `${route} (${created.mode})`
  expectNoCaseSecrets(created, secrets, what('POST /api/practice'), options)
  const saved = await student.put(`/api/practice/${created.id}/draft`, draft)
  expect(saved.status).toBe(200)
  expectNoCaseSecrets(saved.body, secrets, what('PUT /api/practice/:id/draft'), options)
  if (created.mode === 'patient-turns') {
    for (const setting of [{ gaze: 'primary', distance: 'near' }, { gaze: 'down', distance: 'near', prisms: [{ eye: 'LE', power: 8, base: 'up' }] }, { gaze: 'primary', distance: 'distance', lights: 'on' }]) {
      const turn = await student.post(`/api/practice/${created.id}/turns`, setting)
      expect(turn.status).toBe(200)
      expectNoCaseSecrets(turn.body, secrets, what('POST /api/practice/:id/turns'), options)
    }
  }
  const got = await student.get(`/api/practice/${created.id}`)
  expect(got.status).toBe(200)
  expect(got.body.attempts).toEqual([])
  expectNoCaseSecrets(got.body, secrets, what('GET /api/practice/:id'), { ...options, ignore: [...(options.ignore ?? []), ...OWN_INPUT] })
}

describe('no case-carrying response gives the answer away', () => {
  for (const t of CASE_TEMPLATES) {
    it(`${t.id}, chosen by the learner, both modes`, async () => {
      const base = t.id.replace(/-(standard|challenging)$/, '')
      for (const mode of MODES) {
        for (const seed of SEEDS) {
          const created = await student.post('/api/practice', { template: base, difficulty: t.difficulty, seed, mode })
          expect(created.status).toBe(201)
          expect(created.body.template).toBe(base)
          // the learner chose the template, so its id and title may be named — nothing else
          await scanCase(created.body, caseSecrets(generateCase(t, seed), { templateHidden: false }), { ignore: [/^(template|title)$/] })
        }
      }
    })
  }

  it('"any": 40 cases across both modes name neither the template nor anything of the truth', async () => {
    const seen = new Set<string>()
    for (let i = 0; i < 40; i++) {
      const mode = MODES[i % 2]!
      const created = await student.post('/api/practice', { template: 'any', mode, difficulty: i % 4 < 2 ? 'standard' : 'challenging' })
      expect(created.status).toBe(201)
      expect(created.body).toMatchObject({ template: null, title: null })
      const row = db.get<{ template_id: string, seed: string }>('SELECT template_id, seed FROM cases WHERE id = ?', created.body.id)!
      seen.add(row.template_id)
      await scanCase(created.body, caseSecrets(generateCase(row.template_id, row.seed), { templateHidden: true }), {})
    }
    // the server really does choose among many templates
    expect(seen.size).toBeGreaterThan(8)
  })
})

describe('the scan itself', () => {
  it('catches the truth once it is due (an attempt\'s response) and a planted number', async () => {
    const created = (await student.post('/api/practice', { template: 'any', seed: 'scan-self' })).body
    const row = db.get<{ template_id: string, seed: string }>('SELECT template_id, seed FROM cases WHERE id = ?', created.id)!
    const patient = generateCase(row.template_id, row.seed)
    const secrets = caseSecrets(patient)
    const attempt = await student.post(`/api/practice/${created.id}/attempts`, { gaze: 'primary', distance: 'near', readings: { RE: 90, LE: 90 }, record: 'DMR N PP: nil' })
    const leaks = findCaseSecrets(attempt.body, secrets)
    expect(leaks.some(l => l.startsWith('truth'))).toBe(true)
    expect(leaks.some(l => /modelRecord/.test(l))).toBe(true)
    // after an attempt the case names its template
    const after = (await student.get(`/api/practice/${created.id}`)).body
    expect(findCaseSecrets({ template: after.template }, secrets)).not.toEqual([])

    const t = [...Object.values(patient.gazes)].map(g => g.torsion.RE).find(v => Math.abs(v) >= 1)
    if (t !== undefined) expect(findCaseSecrets({ presentation: { hint: t } }, secrets)).toHaveLength(1)
    expect(findCaseSecrets({ presentation: { positions: { primary: { alignment: { vertical: t ?? 3 } } } } }, secrets)).toEqual([])
  })
})
