import { describe, expect, inject, it } from 'vitest'
import { Client, DEMO, linkIn, signedIn, waitForMail } from '../support/client'
import { readDb } from '../support/db'

const baseURL = inject('baseURL')
const dbPath = inject('dbPath')

describe('forgotten password', () => {
  it('e-mails a single-use link that changes the password', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const email = 'wen.hallowby@cyclodial.test'
    const guest = new Client(baseURL)
    const asked = await guest.post('/api/auth/forgot', { email })
    expect(asked.status).toBe(200)

    const mail = await waitForMail(admin, email, /reset/i)
    const token = linkIn(mail.text, '/reset').split('/reset/')[1]!

    const weak = await guest.post('/api/auth/reset', { token, password: 'short' })
    expect(weak.status).toBe(400)
    expect(weak.body.data.fields[0].path).toBe('password')

    const done = await guest.post('/api/auth/reset', { token, password: 'brand-new-password-42' })
    expect(done.status).toBe(200)
    expect((await guest.post('/api/auth/login', { email, password: 'cyclodial-demo' })).status).toBe(401)
    expect((await guest.post('/api/auth/login', { email, password: 'brand-new-password-42' })).status).toBe(200)

    const reuse = await guest.post('/api/auth/reset', { token, password: 'yet-another-password' })
    expect(reuse.status).toBe(410)
    expect(reuse.body.message).toMatch(/already been used/)
  })

  it('expires the link', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const email = 'milo.strathearn@cyclodial.test'
    await new Client(baseURL).post('/api/auth/forgot', { email })
    const mail = await waitForMail(admin, email, /reset/i)
    const token = linkIn(mail.text, '/reset').split('/reset/')[1]!
    const db = readDb(dbPath, { write: true })
    db.run(`update password_resets set expires_at = ? where user_id = (select id from users where email = ?)`, '2000-01-01T00:00:00.000Z', email)
    db.close()
    const late = await new Client(baseURL).post('/api/auth/reset', { token, password: 'brand-new-password-42' })
    expect(late.status).toBe(410)
    expect(late.body.message).toMatch(/expired/)
  })

  it('gives the same answer for unknown e-mails and sends nothing', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const before = (await admin.get('/api/admin/outbox?pageSize=100')).body.total
    const known = await new Client(baseURL).post('/api/auth/forgot', { email: 'kofi.ashgrove@cyclodial.test' })
    const unknown = await new Client(baseURL).post('/api/auth/forgot', { email: 'no.such.person@cyclodial.test' })
    expect(unknown.status).toBe(200)
    expect(unknown.body.message).toBe(known.body.message)
    await waitForMail(admin, 'kofi.ashgrove@cyclodial.test', /reset/i)
    const after = (await admin.get('/api/admin/outbox?pageSize=100')).body
    expect(after.total).toBe(before + 1)
    expect(after.items.some((m: { to: string }) => m.to.includes('no.such.person'))).toBe(false)
  })
})
