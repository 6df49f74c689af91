// Roster upload over HTTP: per-row report, all-or-nothing import with invitations
// and e-mails, and refusal of files that are too large or not CSV text.
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { Client, DEMO, linkIn, signedIn, waitForMail } from '../support/client'

const baseURL = inject('baseURL')

const form = (content: BlobPart, type = 'text/csv', name = 'roster.csv', cohortId?: number) => {
  const f = new FormData()
  f.append('file', new Blob([content], { type }), name)
  if (cohortId) f.append('cohortId', String(cohortId))
  return f
}

describe('roster upload', () => {
  let tutor: Client
  let admin: Client
  let kestrel: number
  const invitationCount = async () => (await admin.get('/api/admin/invitations?pageSize=100')).body.total as number

  beforeAll(async () => {
    tutor = await signedIn(baseURL, DEMO.tutor)
    admin = await signedIn(baseURL, DEMO.admin)
    kestrel = (await admin.get('/api/admin/cohorts')).body.items.find((c: { name: string }) => c.name === 'Kestrel cohort').id
  })

  const mixed = [
    'name,email,cohort',
    'Lowen Tarrant,lowen.tarrant@cyclodial.test,Kestrel cohort',
    'Mab Ferrow,mab.ferrow@,Kestrel cohort',
    'Lowen Again,LOWEN.TARRANT@cyclodial.test,',
    'Nye Corris,nye.corris@cyclodial.test,Osprey cohort',
    'Tamsin Again,student@cyclodial.test,Kestrel cohort',
    'Pell Vantry,pell.vantry@cyclodial.test,Heron cohort',
  ].join('\r\n')

  it('previews every row with its own problems', async () => {
    const r = await tutor.postForm('/api/roster/preview', form(mixed, 'text/csv', 'roster.csv', kestrel))
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ total: 6, valid: 1, invalid: 5, canImport: false })
    const problems = Object.fromEntries(r.body.rows.map((row: { line: number, problems: string[] }) => [row.line, row.problems.join(' ')]))
    expect(problems).toEqual({
      2: '',
      3: expect.stringMatching(/not a valid e-mail/),
      4: expect.stringMatching(/Duplicate: lowen.tarrant@cyclodial.test is already on line 2/),
      5: expect.stringMatching(/Unknown cohort “Osprey cohort”/),
      6: expect.stringMatching(/already has a Cyclodial account/),
      7: expect.stringMatching(/do not teach/),
    })
  })

  it('imports nothing when any row is bad', async () => {
    const before = await invitationCount()
    const r = await tutor.postForm('/api/roster/import', form(mixed, 'text/csv', 'roster.csv', kestrel))
    expect(r.status).toBe(400)
    expect(r.body.message).toMatch(/Nothing was imported: 5 of 6 rows have problems/)
    expect(r.body.data.report.rows).toHaveLength(6)
    expect(await invitationCount()).toBe(before)
  })

  it('imports a clean roster: one invitation per row, each e-mailed', async () => {
    const before = await invitationCount()
    const clean = 'Name,E-mail\nSeren Walby,seren.walby@cyclodial.test\n"Oakes, Tibor",tibor.oakes@cyclodial.test\n'
    const r = await tutor.postForm('/api/roster/import', form(clean, 'text/csv', 'roster.csv', kestrel))
    expect(r.status).toBe(201)
    expect(r.body).toMatchObject({ imported: 2 })
    expect(await invitationCount()).toBe(before + 2)
    const mail = await waitForMail(admin, 'tibor.oakes@cyclodial.test', /invited to Cyclodial/)
    expect(mail.text).toMatch(/as a student in the Kestrel cohort/)
    const invites = (await admin.get('/api/admin/invitations?pageSize=100')).body.items
    expect(invites.find((i: { email: string }) => i.email === 'seren.walby@cyclodial.test')).toMatchObject({ role: 'student' })
    // The roster's name travels with the invitation, ready on the acceptance form.
    const token = linkIn(mail.text, '/invite').split('/invite/')[1]!
    const offer = await new Client(baseURL).get(`/api/invitations/${token}`)
    expect(offer.body).toMatchObject({ email: 'tibor.oakes@cyclodial.test', name: 'Oakes, Tibor' })
  })

  it('refuses a file over 1 MB, a file that is not CSV, and binary content labelled as CSV', async () => {
    const big = `name,email\n${'x'.repeat(1024 * 1024 + 10)}`
    const tooBig = await tutor.postForm('/api/roster/preview', form(big))
    expect(tooBig.status).toBe(413)
    expect(tooBig.body.message).toMatch(/at most 1 MB/)

    const png = await tutor.postForm('/api/roster/preview', form('name,email\n', 'image/png', 'roster.png'))
    expect(png.status).toBe(415)
    expect(png.body.message).toMatch(/not a CSV/)

    const disguised = await tutor.postForm('/api/roster/preview', form(new Uint8Array([0x50, 0x4B, 0x03, 0x04, 0x14, 0x00, 0x06, 0x00]), 'text/csv', 'roster.csv'))
    expect(disguised.status).toBe(415)
    expect(disguised.body.message).toMatch(/binary data/)

    const noFile = await tutor.post('/api/roster/preview', { file: 'name,email' })
    expect(noFile.status).toBe(400)
    expect(noFile.body.data.fields[0].path).toBe('file')

    const student = await signedIn(baseURL, DEMO.student)
    expect((await student.postForm('/api/roster/preview', form('name,email\n'))).status).toBe(403)
  })
})
