// Issue 12, point 11: a forgotten-password request answers the same, in the same
// time, whether or not the e-mail has an account (the mail is queued after the
// answer), and sends at most a few reset e-mails per account and per address an hour.
import { createServer, type Server, type Socket } from 'node:net'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client } from '../support/client'
import { freePort, startServer, type RunningServer } from '../support/server'
import { readDb } from '../support/db'

describe('forgotten password', () => {
  let server: RunningServer
  let smtp: Server
  const sockets: Socket[] = []
  beforeAll(async () => {
    // An SMTP server that accepts connections and never says a word: sending
    // a mail inside the request would hang the answer.
    const smtpPort = await freePort()
    smtp = createServer((socket) => {
      sockets.push(socket)
      socket.on('error', () => {})
    })
    await new Promise<void>(r => smtp.listen(smtpPort, '127.0.0.1', r))
    server = await startServer({ env: { NUXT_MAIL_CATCHER: '0', SMTP_URL: `smtp://127.0.0.1:${smtpPort}` } })
  })
  afterAll(async () => {
    await server?.stop()
    for (const s of sockets) s.destroy()
    await new Promise(r => smtp?.close(r))
  })

  async function timed(email: string): Promise<{ ms: number, status: number, body: unknown }> {
    const started = performance.now()
    const reply = await new Client(server.baseURL).post('/api/auth/forgot', { email })
    return { ms: performance.now() - started, status: reply.status, body: reply.body }
  }

  it('answers at once and alike for an account and for nobody, even when mail is slow', async () => {
    const known = await timed('kofi.ashgrove@cyclodial.test')
    const unknown = await timed('nobody.at.all@cyclodial.test')
    expect(known.status).toBe(200)
    expect(unknown.status).toBe(200)
    expect(known.body).toEqual(unknown.body)
    // the stalled mail server would hold an answer that waited for it for a minute or more
    expect(known.ms).toBeLessThan(1500)
    expect(unknown.ms).toBeLessThan(1500)
  })

  it('issues at most 3 reset links per account an hour, answering the same every time', async () => {
    const email = 'freya.dunmoor@cyclodial.test'
    const replies = []
    for (let i = 0; i < 6; i++) replies.push(await timed(email))
    expect(new Set(replies.map(r => JSON.stringify(r.body))).size).toBe(1)
    await new Promise(r => setTimeout(r, 500))
    const db = readDb(server.dbPath)
    const n = db.count(`select count(*) as n from password_resets where user_id = (select id from users where email = ?)`, email)
    db.close()
    expect(n).toBe(3)
  })

  it('issues at most 10 reset links an hour to one asking address, whichever accounts it names', async () => {
    const emails = ['student@cyclodial.test', 'jory.feldane@cyclodial.test', 'priya.vellacott@cyclodial.test', 'oisin.marrable@cyclodial.test', 'wen.hallowby@cyclodial.test', 'adaeze.quillon@cyclodial.test', 'milo.strathearn@cyclodial.test', 'ines.calloway@cyclodial.test', 'rafe.tolliver@cyclodial.test', 'noor.bramblecote@cyclodial.test', 'tutor@cyclodial.test']
    for (const email of emails) expect((await timed(email)).status).toBe(200)
    await new Promise(r => setTimeout(r, 500))
    const db = readDb(server.dbPath)
    const n = db.count(`select count(*) as n from password_resets`)
    db.close()
    // 1 (Kofi) + 3 (Freya) before; the address's limit is 10
    expect(n).toBe(10)
  })
})
