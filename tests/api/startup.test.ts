// Start-up behaviour of the built server, each case on its own server process.
import { SMTPServer } from 'smtp-server'
import { describe, expect, it } from 'vitest'
import { Client, DEMO } from '../support/client'
import { freePort, startServer, startUpExit } from '../support/server'
import { readDb } from '../support/db'

describe('start-up', () => {
  it('refuses to start in production without a session password', async () => {
    const { code, out } = await startUpExit({ NUXT_SESSION_PASSWORD: '' })
    expect(code).toBe(1)
    expect(out).toMatch(/NUXT_SESSION_PASSWORD/)
  })

  it('migrates and seeds a new database file when asked, and not otherwise', async () => {
    const seeded = await startServer({ seed: true })
    try {
      const db = readDb(seeded.dbPath)
      const people = db.all('select role, count(*) as n from users group by role order by role')
      db.close()
      expect(people).toEqual([
        { role: 'admin', n: 1 }, { role: 'lecturer', n: 1 }, { role: 'student', n: 12 }, { role: 'tutor', n: 2 },
      ])
    }
    finally { await seeded.stop() }

    const bare = await startServer({ seed: false })
    try {
      const db = readDb(bare.dbPath)
      expect(db.get('select count(*) as n from users')).toEqual({ n: 0 })
      expect(db.get(`select count(*) as n from kysely_migration`)).toMatchObject({ n: expect.any(Number) })
      db.close()
    }
    finally { await bare.stop() }
  })

  it('keeps an invitation when mail fails, and delivers it on retry', async () => {
    const smtpPort = await freePort()
    const server = await startServer({ env: { NUXT_MAIL_CATCHER: '0', SMTP_URL: `smtp://127.0.0.1:${smtpPort}`, NUXT_MAIL_RETRY_SECONDS: '1' } })
    const received: string[] = []
    let smtp: SMTPServer | undefined
    try {
      const admin = new Client(server.baseURL)
      await admin.signIn(DEMO.admin)
      const invited = await admin.post('/api/admin/invitations', { email: 'retry.me@cyclodial.test', role: 'student' })
      expect(invited.status).toBe(201)
      expect(invited.body.mailSent).toBe(false)
      expect(invited.body.message).toMatch(/will be retried/)

      const db = readDb(server.dbPath)
      expect(db.get('select count(*) as n from invitations where email = ?', 'retry.me@cyclodial.test')).toEqual({ n: 1 })
      expect(db.get('select status, attempts from mail_jobs where to_address = ?', 'retry.me@cyclodial.test')).toEqual({ status: 'pending', attempts: 1 })

      // The mail server comes back; the retry loop delivers the waiting message.
      smtp = new SMTPServer({
        authOptional: true,
        disabledCommands: ['STARTTLS'],
        logger: false,
        onData(stream, _s, cb) {
          let raw = ''
          stream.on('data', (c) => {
            raw += String(c)
          })
          stream.on('end', () => {
            received.push(raw)
            cb()
          })
        },
      })
      await new Promise<void>(r => smtp!.listen(smtpPort, '127.0.0.1', () => r()))
      const deadline = Date.now() + 20_000
      while (!received.length && Date.now() < deadline) await new Promise(r => setTimeout(r, 200))
      expect(received).toHaveLength(1)
      expect(received[0]).toMatch(/retry\.me@cyclodial\.test/)
      await new Promise(r => setTimeout(r, 300))
      expect(db.get('select status from mail_jobs where to_address = ?', 'retry.me@cyclodial.test')).toEqual({ status: 'sent' })
      db.close()
    }
    finally {
      smtp?.close()
      await server.stop()
    }
  })
})
