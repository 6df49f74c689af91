// Issue 12, point 13: a reset or invitation link is consumed by one conditional
// update inside the transaction, so three simultaneous uses give exactly one success.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, linkIn, signedIn, waitForMail } from '../support/client'
import { startServer, type RunningServer } from '../support/server'

describe('single-use links under a race', () => {
  let server: RunningServer
  beforeAll(async () => {
    server = await startServer()
  })
  afterAll(async () => {
    await server?.stop()
  })

  it('three simultaneous uses of one reset link: exactly one changes the password', async () => {
    const admin = await signedIn(server.baseURL, DEMO.admin)
    const email = 'rafe.tolliver@cyclodial.test'
    await new Client(server.baseURL).post('/api/auth/forgot', { email })
    const token = linkIn((await waitForMail(admin, email, /reset/i)).text, '/reset').split('/reset/')[1]!
    const passwords = ['Harbour-Lichen-Tempo-31', 'Saffron-Glacier-Mosaic-47', 'Thimble-Orbit-Canyon-62']
    const replies = await Promise.all(passwords.map(password => new Client(server.baseURL).post('/api/auth/reset', { token, password })))
    const statuses = replies.map(r => r.status).sort()
    expect(statuses).toEqual([200, 410, 410])
    const winner = passwords[replies.findIndex(r => r.status === 200)]!
    expect((await new Client(server.baseURL).post('/api/auth/login', { email, password: winner })).status).toBe(200)
    for (const loser of passwords.filter(p => p !== winner)) {
      expect((await new Client(server.baseURL).post('/api/auth/login', { email, password: loser })).status).toBe(401)
    }
  })

  it('three simultaneous acceptances of one invitation: exactly one account', async () => {
    const admin = await signedIn(server.baseURL, DEMO.admin)
    const email = 'race.invitee@cyclodial.test'
    expect((await admin.post('/api/admin/invitations', { email, role: 'lecturer' })).status).toBe(201)
    const token = linkIn((await waitForMail(admin, email, /invited/i)).text, '/invite').split('/invite/')[1]!
    const replies = await Promise.all(['Ada Wrenfield', 'Bea Wrenfield', 'Cal Wrenfield'].map(name =>
      new Client(server.baseURL).post(`/api/invitations/${token}/accept`, { name, password: 'Copper-Meadow-Violin-88' })))
    expect(replies.filter(r => r.status === 200)).toHaveLength(1)
    expect(replies.filter(r => r.status === 410 || r.status === 409)).toHaveLength(2)
    const users = (await admin.get('/api/admin/users?pageSize=100')).body.items as { email: string }[]
    expect(users.filter(u => u.email === email)).toHaveLength(1)
  })
})
