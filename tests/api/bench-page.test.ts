// The bench page as the server renders it: its payload (the data handed to the
// browser before any attempt) must not give the answer away — no
// condition, signed torsion, direction label or model record — whichever mode, and
// whether the learner chose the template or Cyclodial did.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { MODES } from '#shared/engine/types'
import { generateCase } from '~~/server/lib/engine/generator'
import type { Client } from '../support/client'
import { signedIn } from '../support/client'
import { readDb } from '../support/db'
import { payloadText, revivePayload } from '../support/nuxt-payload'
import type { ScanOptions } from '../support/secrecy'
import { caseSecrets, expectNoCaseSecrets, findCaseSecrets } from '../support/secrecy'

const baseURL = inject('baseURL')
const db = readDb(inject('dbPath'))
afterAll(() => db.close())

// a student of the demo school whom no other API test uses: the random ("any") cases and
// the attempt made here must not show up in another test's history counts
const STUDENT = 'noor.bramblecote@cyclodial.test'

let student: Client
beforeAll(async () => {
  student = await signedIn(baseURL, STUDENT)
})

async function benchPayload(id: number): Promise<any> {
  const page = await student.request('GET', `/practice/${id}`, undefined, { headers: { accept: 'text/html' } })
  expect(page.status).toBe(200)
  const text = payloadText(String(page.body))
  expect(text, 'the bench page carries a Nuxt payload').not.toBeNull()
  return revivePayload(text!)
}

async function checkCase(created: any, options: ScanOptions & { hidden: boolean }) {
  const row = db.get<{ template_id: string, seed: string }>('SELECT template_id, seed FROM cases WHERE id = ?', created.id)!
  const secrets = caseSecrets(generateCase(row.template_id, row.seed), { templateHidden: options.hidden })
  if (created.mode === 'patient-turns') {
    expect((await student.post(`/api/practice/${created.id}/turns`, { gaze: 'primary', distance: 'near' })).status).toBe(200)
  }
  expect((await student.put(`/api/practice/${created.id}/draft`, {
    gaze: 'down', distance: 'near', readings: { RE: 93, LE: 88 }, prisms: [{ eye: 'RE', power: 6, base: 'down' }], lights: 'dim', record: 'DMR near',
  })).status).toBe(200)
  const payload = await benchPayload(created.id)
  // not a vacuous scan: the payload holds the case's presentation and the saved bench (the
  // bench's own state is made afresh in the browser from these, never handed down)
  expect(JSON.stringify(payload)).toContain(created.presentation.wordsKey)
  expect(payload.data?.[`practice-case-${created.id}`]?.draft?.gaze).toBe('down')
  expectNoCaseSecrets(payload, secrets, `the bench page's payload (${created.mode})`, options)
}

describe('the bench page payload before an attempt', () => {
  for (const mode of MODES) {
    it(`names nothing of the truth when Cyclodial chose the case (${mode})`, async () => {
      for (let i = 0; i < 6; i++) {
        const created = await student.post('/api/practice', { template: 'any', mode })
        expect(created.status).toBe(201)
        await checkCase(created.body, { hidden: true })
      }
    })

    it(`names only the template the learner chose (${mode})`, async () => {
      const created = await student.post('/api/practice', { template: 'so-palsy-right', seed: 'bench-page-7', mode })
      expect(created.status).toBe(201)
      await checkCase(created.body, { hidden: false, ignore: [/\.(template|title)$/] })
    })
  }

  it('would catch the truth: after an attempt the payload carries it, and the scan says so', async () => {
    const created = (await student.post('/api/practice', { template: 'any', seed: 'bench-page-after' })).body
    const row = db.get<{ template_id: string, seed: string }>('SELECT template_id, seed FROM cases WHERE id = ?', created.id)!
    const secrets = caseSecrets(generateCase(row.template_id, row.seed))
    expect((await student.post(`/api/practice/${created.id}/attempts`, { gaze: 'primary', distance: 'near', readings: { RE: 90, LE: 90 }, record: 'DMR near primary: nil' })).status).toBe(201)
    const leaks = findCaseSecrets(await benchPayload(created.id), secrets)
    expect(leaks.some(l => /truth|modelRecord/.test(l))).toBe(true)
  })
})
