import { describe, expect, inject, it } from 'vitest'
import { Client, DEMO, linkIn, signedIn, waitForMail } from '../support/client'
import { readDb } from '../support/db'

const baseURL = inject('baseURL')
const dbPath = inject('dbPath')

async function cohortId(admin: Client, name: string): Promise<number> {
  const cohorts = await admin.get('/api/admin/cohorts')
  return cohorts.body.items.find((c: { name: string }) => c.name === name).id
}

describe('invitations', () => {
  it('greets the invited person by name when one was given (issue 13)', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const email = 'named.invitee@cyclodial.test'
    const invited = await admin.post('/api/admin/invitations', { email, name: 'Tove Ashcombe', role: 'tutor', cohortId: null })
    expect(invited.status).toBe(201)
    const mail = await waitForMail(admin, email, /invited/i)
    expect(mail.text.split('\n')[0]).toBe('Hello Tove Ashcombe,')
    expect(mail.text).toContain('check your name and choose your password')
  })

  it('runs end to end: invite, e-mail, accept, signed in with role and cohort', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const heron = await cohortId(admin, 'Heron cohort')
    const email = 'new.student@cyclodial.test'

    const invited = await admin.post('/api/admin/invitations', { email, role: 'student', cohortId: heron })
    expect(invited.status).toBe(201)
    expect(invited.body.mailSent).toBe(true)

    const mail = await waitForMail(admin, email, /invited/i)
    const link = linkIn(mail.text, '/invite')
    const token = link.split('/invite/')[1]!
    expect(link.startsWith(baseURL)).toBe(true)
    // no name was given: a plain greeting
    expect(mail.text.split('\n')[0]).toBe('Hello,')

    const guest = new Client(baseURL)
    const info = await guest.get(`/api/invitations/${token}`)
    expect(info.status).toBe(200)
    expect(info.body).toMatchObject({ email, name: null, role: 'student', cohortName: 'Heron cohort' })

    const weak = await guest.post(`/api/invitations/${token}/accept`, { name: 'New Student', password: 'short' })
    expect(weak.status).toBe(400)
    expect(weak.body.data.fields[0].path).toBe('password')

    const accepted = await guest.post(`/api/invitations/${token}/accept`, { name: 'Nell Harrowby', password: 'a-long-enough-password' })
    expect(accepted.status).toBe(200)
    expect(accepted.body.home).toBe('/student')
    const me = await guest.get('/api/auth/me')
    expect(me.body.user).toMatchObject({ email, name: 'Nell Harrowby', role: 'student' })

    const list = await admin.get(`/api/admin/users?q=${encodeURIComponent('Harrowby')}`)
    expect(list.body.items[0].cohorts.map((c: { name: string }) => c.name)).toEqual(['Heron cohort'])

    const again = await new Client(baseURL).post(`/api/invitations/${token}/accept`, { name: 'Someone Else', password: 'another-long-password' })
    expect(again.status).toBe(410)
    expect(again.body.message).toMatch(/already been used/)

    const audit = await admin.get('/api/admin/audit?pageSize=100')
    const actions = audit.body.items.map((e: { action: string }) => e.action)
    expect(actions).toEqual(expect.arrayContaining(['invitation.created', 'invitation.accepted']))
  })

  it('refuses an expired invitation', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const email = 'late.tutor@cyclodial.test'
    await admin.post('/api/admin/invitations', { email, name: 'Ivo Lattimer', role: 'tutor' })
    const mail = await waitForMail(admin, email, /invited/i)
    const token = linkIn(mail.text, '/invite').split('/invite/')[1]!

    const db = readDb(dbPath, { write: true })
    db.run('update invitations set expires_at = ? where email = ?', '2000-01-01T00:00:00.000Z', email)
    db.close()

    const guest = new Client(baseURL)
    const db2 = readDb(dbPath)
    expect(db2.get('select name from invitations where email = ?', email)).toEqual({ name: 'Ivo Lattimer' })
    db2.close()
    expect((await guest.get(`/api/invitations/${token}`)).status).toBe(410)
    const accept = await guest.post(`/api/invitations/${token}/accept`, { name: 'Too Late', password: 'a-long-enough-password' })
    expect(accept.status).toBe(410)
    expect(accept.body.message).toMatch(/expired/)
  })

  it('refuses to invite an e-mail that already has an account, and bad input', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const dup = await admin.post('/api/admin/invitations', { email: DEMO.student, role: 'student' })
    expect(dup.status).toBe(409)
    const bad = await admin.post('/api/admin/invitations', { email: 'nope', role: 'wizard' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.map((f: { path: string }) => f.path)).toEqual(expect.arrayContaining(['email', 'role']))
    const unknownCohort = await admin.post('/api/admin/invitations', { email: 'x.y@cyclodial.test', role: 'student', cohortId: 99999 })
    expect(unknownCohort.status).toBe(400)
    expect(unknownCohort.body.data.fields[0].path).toBe('cohortId')
  })
})
