// Issue 12, point 14: passwords of at least 12 characters (OWASP ASVS 4.0
// V2.1.1), refused when the zxcvbn estimator rates them weak, when they are
// common (V2.1.7), or when they contain the person's e-mail or name; the 400
// names the field and says why.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, linkIn, signedIn, waitForMail } from '../support/client'
import { startServer, type RunningServer } from '../support/server'

describe('password rules', () => {
  let server: RunningServer
  beforeAll(async () => {
    server = await startServer()
  })
  afterAll(async () => {
    await server?.stop()
  })

  it('refuses short, common, guessable and personal passwords when resetting, saying why', async () => {
    const admin = await signedIn(server.baseURL, DEMO.admin)
    const email = 'milo.strathearn@cyclodial.test'
    await new Client(server.baseURL).post('/api/auth/forgot', { email })
    const token = linkIn((await waitForMail(admin, email, /reset/i)).text, '/reset').split('/reset/')[1]!
    const guest = new Client(server.baseURL)
    const refusals: [string, RegExp][] = [
      ['Elev3n-char', /at least 12 characters/], // 11 characters
      ['password1234', /common|easy to guess/], // in every common-password list (from memory)
      ['123456789012', /common|easy to guess/],
      ['qwertyuiop12', /common|easy to guess/],
      ['aaaaaaaaaaaaaaaa', /easy to guess/],
      ['milo.strathearn!77', /name or the first part of your e-mail/],
      ['Strathearn-Forever-9', /name or the first part of your e-mail/],
    ]
    for (const [password, why] of refusals) {
      const reply = await guest.post('/api/auth/reset', { token, password })
      expect(reply.status, password).toBe(400)
      expect(reply.body.data.fields[0].path, password).toBe('password')
      expect(reply.body.message, password).toMatch(why)
    }
    // the link still works after refusals, for a strong password
    expect((await guest.post('/api/auth/reset', { token, password: 'Lantern-Basalt-Fjord-204' })).status).toBe(200)
  })

  it('applies the same rules when accepting an invitation', async () => {
    const admin = await signedIn(server.baseURL, DEMO.admin)
    const email = 'perpetua.quennell@cyclodial.test'
    expect((await admin.post('/api/admin/invitations', { email, role: 'lecturer' })).status).toBe(201)
    const token = linkIn((await waitForMail(admin, email, /invited/i)).text, '/invite').split('/invite/')[1]!
    const guest = new Client(server.baseURL)
    const personal = await guest.post(`/api/invitations/${token}/accept`, { name: 'Perpetua Quennell', password: 'quennell-rules-2026' })
    expect(personal.status).toBe(400)
    expect(personal.body.data.fields[0].path).toBe('password')
    expect(personal.body.message).toMatch(/name/)
    const common = await guest.post(`/api/invitations/${token}/accept`, { name: 'Perpetua Quennell', password: 'iloveyou12345' })
    expect(common.status).toBe(400)
    expect(common.body.message).toMatch(/common|easy to guess/)
    const ok = await guest.post(`/api/invitations/${token}/accept`, { name: 'Perpetua Quennell', password: 'Marble-Heron-Quiver-73' })
    expect(ok.status).toBe(200)
  })
})
