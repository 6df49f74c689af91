// Issue 12, points 9, 10, 12 and 15 against the built server: body limits,
// the one CSV writer and one-line names, cross-site requests, production posture
// (HSTS, weak session passwords, the demo seed's second flag, paged lists).
import { request as httpRequest } from 'node:http'
import Papa from 'papaparse'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { Client, DEMO, signedIn } from '../support/client'
import { startServer, startUpExit } from '../support/server'
import type { RunningServer } from '../support/server'
import { readDb } from '../support/db'

const baseURL = inject('baseURL')
const dbPath = inject('dbPath')
const MB = 1024 * 1024

interface RawReply { status: number, body: string, headers: Record<string, string | string[] | undefined>, sentBytes: number }

/**
 * Sends a body by node:http so the test controls its framing: a declared length
 * with only part of the bytes sent, or chunks until the server answers.
 */
function rawPost(path: string, opts: { headers: Record<string, string>, chunks: number, chunkSize: number, declaredLength?: number, partialBytes?: number }): Promise<RawReply> {
  const url = new URL(path, baseURL)
  return new Promise((resolveReply, reject) => {
    let sentBytes = 0
    let answered = false
    let failed = false
    const headers: Record<string, string> = { ...opts.headers }
    if (opts.declaredLength !== undefined) headers['content-length'] = String(opts.declaredLength)
    const req = httpRequest({ host: url.hostname, port: url.port, path: url.pathname, method: 'POST', headers }, (res) => {
      answered = true
      let body = ''
      res.on('data', (c) => {
        body += String(c)
      })
      res.on('end', () => resolveReply({ status: res.statusCode ?? 0, body, headers: res.headers, sentBytes }))
      res.on('error', reject)
    })
    // a server that refuses early closes the connection: writing on may fail (EPIPE)
    // just before the refusal is read, so give the answer a moment to arrive
    req.on('error', (e) => {
      failed = true
      setTimeout(() => {
        if (!answered) reject(e)
      }, 1000)
    })
    const chunk = Buffer.alloc(opts.chunkSize, 0x20) // spaces: valid JSON white space
    if (opts.partialBytes !== undefined) {
      // a declared length far beyond what is sent: a server that waits for it all never answers
      req.write(Buffer.alloc(opts.partialBytes, 0x20))
      sentBytes += opts.partialBytes
      return
    }
    // one chunk per turn of the event loop, as a browser uploading would: the
    // answer is read as soon as it comes, while the rest is still being sent
    let i = 0
    const pump = () => {
      if (answered || failed) return
      if (i >= opts.chunks) {
        req.end()
        return
      }
      i++
      sentBytes += chunk.length
      if (req.write(chunk)) setImmediate(pump)
      else req.once('drain', pump)
    }
    pump()
  })
}

describe('point 9: body limits', () => {
  it('refuses a JSON body declared over 1 MB with 413 before reading it (600 MB declared, a few bytes sent)', async () => {
    const reply = await rawPost('/api/auth/login', { headers: { 'content-type': 'application/json' }, chunks: 0, chunkSize: 0, declaredLength: 600 * MB, partialBytes: 16 })
    expect(reply.status).toBe(413)
    expect(JSON.parse(reply.body)).toMatchObject({ data: { code: 'body-too-large' } })
    expect(reply.body).toMatch(/1 MB/)
  }, 15_000)

  it('refuses a chunked JSON body with 413 once it passes 1 MB, without waiting for the rest', async () => {
    // 64 KiB chunks, up to 64 MiB offered; the server must answer after about 1 MiB
    const reply = await rawPost('/api/auth/login', { headers: { 'content-type': 'application/json', 'transfer-encoding': 'chunked' }, chunks: 1024, chunkSize: 64 * 1024 })
    expect(reply.status).toBe(413)
    expect(reply.sentBytes).toBeLessThan(64 * MB)
  }, 30_000)

  it('still reads a JSON body just under 1 MB, chunked or not (a 400 for the content, not a 413)', async () => {
    const padded = JSON.stringify({ email: 'nobody@cyclodial.test', password: 'x', pad: 'a'.repeat(MB - 200) })
    const plain = await new Client(baseURL).request('POST', '/api/auth/login', undefined, { raw: padded })
    expect(plain.status).not.toBe(413)
    expect(plain.status).toBeLessThan(500)
    const chunked = await rawPost('/api/record-check', { headers: { 'content-type': 'application/json', 'transfer-encoding': 'chunked' }, chunks: 15, chunkSize: 64 * 1024 })
    expect(chunked.status).not.toBe(413)
    expect(chunked.status).toBeLessThan(500)
  }, 15_000)

  it('leaves uploads to their own limits: a 2 MB multipart photograph upload is judged by its content, not the JSON limit', async () => {
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const form = new FormData()
    form.append('file', new Blob([Buffer.alloc(2 * MB, 7)], { type: 'image/png' }), 'big.png')
    form.append('title', 'Not a picture')
    form.append('eye', 'RE')
    form.append('consent', 'yes')
    const reply = await tutor.postForm('/api/fundus/photos', form)
    expect(reply.status).toBe(415) // its own check: not a JPEG or PNG by its bytes
  })
})

describe('point 10: one CSV writer; one-line names', () => {
  it('refuses names with line breaks or control characters (400 naming the field), for people, invitations and cohorts', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const users = (await admin.get('/api/admin/users?q=student%40cyclodial.test')).body.items as { id: number, email: string }[]
    const student = users.find(u => u.email === DEMO.student)!
    for (const name of ['Ann\nSmith', 'Ann\r=1+1', 'Ann\tSmith', 'Ann\u0000', 'Ann\u2028Smith', 'Ann\u0085']) {
      const patched = await admin.patch(`/api/admin/users/${student.id}`, { name })
      expect(patched.status, JSON.stringify(name)).toBe(400)
      expect(patched.body.data.fields.map((f: { path: string }) => f.path)).toContain('name')
      expect(patched.body.message).toMatch(/line breaks/)

      const invited = await admin.post('/api/admin/invitations', { email: 'one.line@cyclodial.test', name, role: 'student' })
      expect(invited.status).toBe(400)
      expect(invited.body.data.fields.map((f: { path: string }) => f.path)).toContain('name')

      const cohort = await admin.post('/api/admin/cohorts', { name: `Cohort ${name}` })
      expect(cohort.status).toBe(400)
      expect(cohort.body.data.fields.map((f: { path: string }) => f.path)).toContain('name')
    }
    const accept = await new Client(baseURL).post('/api/invitations/not-a-real-token-0000/accept', { name: 'Ann\nSmith', password: 'a-long-enough-password-1' })
    expect(accept.status).toBe(400)
    expect(accept.body.data.fields.map((f: { path: string }) => f.path)).toContain('name')
  })

  it('reports a roster row whose name holds a line break', async () => {
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const form = new FormData()
    form.append('file', new Blob(['name,email,cohort\n"Ann\nSmith",ann.smith.roster@cyclodial.test,Kestrel cohort\n'], { type: 'text/csv' }), 'roster.csv')
    const reply = await tutor.postForm('/api/roster/preview', form)
    expect(reply.status).toBe(200)
    expect(reply.body.rows[0].problems.join(' ')).toMatch(/line break/)
    expect(reply.body.canImport).toBe(false)
  })

  it('neutralises formula cells in the quiz results CSV, including a line break after the formula and leading white space', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const lecturer = await signedIn(baseURL, DEMO.lecturer)
    const cohort = await admin.post('/api/admin/cohorts', { name: `CSV cohort ${Date.now()}` })
    expect(cohort.status).toBe(201)
    // names stored before names were checked (or by another tool): the writer must still defuse them
    const hostile = ['=HYPERLINK("http://x.invalid","y")\nBob', ' +SUM(1,2)', '@cmd', '\t-1+1', 'plain name', '-2']
    const db = readDb(dbPath, { write: true })
    const now = new Date().toISOString()
    try {
      hostile.forEach((name, i) => {
        const { id } = db.get<{ id: number }>(`insert into users (email, name, role, password_hash, created_at, updated_at) values (?, ?, 'student', 'x', ?, ?) returning id`,
          `csv.${i}.${Date.now()}@cyclodial.test`, name, now, now)!
        db.run('insert into cohort_members (cohort_id, user_id, created_at) values (?, ?, ?)', cohort.body.id, id, now)
      })
    }
    finally { db.close() }
    const quiz = await lecturer.post('/api/quizzes', { title: 'CSV check', cohortIds: [cohort.body.id] })
    expect(quiz.status, JSON.stringify(quiz.body)).toBe(201)
    const csv = await lecturer.request('GET', `/api/quizzes/${quiz.body.id}/results.csv`, undefined, { headers: { accept: 'text/csv' } })
    expect(csv.status).toBe(200)
    const rows = Papa.parse<string[]>(String(csv.body).replace(/^\uFEFF/, '').trim()).data
    const names = rows.slice(1).map(r => r[0])
    // OWASP CSV Injection: a cell starting = + - @ tab or CR is prefixed with an apostrophe
    expect(names).toContain('\'=HYPERLINK("http://x.invalid","y")\nBob')
    expect(names).toContain('\' +SUM(1,2)')
    expect(names).toContain('\'@cmd')
    expect(names).toContain('\'\t-1+1')
    expect(names).toContain('\'-2')
    expect(names).toContain('plain name')
    for (const cell of rows.flat()) expect(cell, JSON.stringify(cell)).not.toMatch(/^[\s]*[=+\-@]|^[\t\r]|[\r\n]\s*[=+\-@]/)
  })

  it('neutralises formula cells in the slip patterns CSV the same way', async () => {
    const lecturer = await signedIn(baseURL, DEMO.lecturer)
    const csv = await lecturer.get('/api/review/export.csv?table=attempts')
    expect(csv.status).toBe(200)
    const rows = Papa.parse<string[]>(String(csv.body).trim()).data
    expect(rows.length).toBeGreaterThan(1)
    for (const cell of rows.flat()) expect(cell, JSON.stringify(cell)).not.toMatch(/^[\s]*[=+\-@]|^[\t\r]|[\r\n]\s*[=+\-@]/)
  })
})

describe('point 12: cross-site requests', () => {
  const check = { torsion: { RE: 10, LE: 0 }, gaze: 'primary', distance: 'near', readings: { RE: 100, LE: 90 }, record: 'DMR N PP: RE 10 in, LE nil' }
  let tutor: Client
  beforeAll(async () => {
    tutor = await signedIn(baseURL, DEMO.tutor)
  })

  it('accepts a same-origin request (Origin, or Sec-Fetch-Site same-origin / none)', async () => {
    expect((await tutor.post('/api/record-check', check)).status).toBe(200)
    expect((await tutor.request('POST', '/api/record-check', check, { headers: { 'origin': '', 'sec-fetch-site': 'same-origin' } })).status).toBe(200)
    expect((await tutor.request('POST', '/api/record-check', check, { headers: { 'origin': '', 'sec-fetch-site': 'none' } })).status).toBe(200)
  })

  it('refuses another origin, a "null" origin and cross-site or same-site fetch metadata with 403', async () => {
    const variants: Record<string, string>[] = [
      { origin: 'http://evil.invalid' },
      { origin: 'null' },
      { origin: baseURL.replace('127.0.0.1', 'localhost') },
      { 'origin': '', 'sec-fetch-site': 'cross-site' },
      { 'origin': '', 'sec-fetch-site': 'same-site' }, // a sibling subdomain: SameSite=Lax cookies would still go
      { 'sec-fetch-site': 'cross-site' },
    ]
    for (const headers of variants) {
      const reply = await tutor.request('POST', '/api/record-check', check, { headers })
      expect(reply.status, JSON.stringify(headers)).toBe(403)
      expect(reply.body.message).toMatch(/cannot change anything/)
    }
    // DELETE and PATCH too, and the module's own session route
    expect((await tutor.request('DELETE', '/api/quizzes/1/items/1', undefined, { headers: { origin: 'http://evil.invalid' } })).status).toBe(403)
    expect((await tutor.request('PATCH', '/api/quizzes/1', { title: 'x' }, { headers: { origin: 'http://evil.invalid' } })).status).toBe(403)
    expect((await tutor.request('DELETE', '/api/_auth/session', undefined, { headers: { origin: 'http://evil.invalid' } })).status).toBe(403)
    // the session survived all of that
    expect((await tutor.get('/api/auth/me')).status).toBe(200)
  })

  it('refuses a request that carries a cookie but names no Origin (and no Sec-Fetch-Site); allows one with no cookie (a script signing in)', async () => {
    const reply = await tutor.request('POST', '/api/record-check', check, { headers: { origin: '' } })
    expect(reply.status).toBe(403)
    expect(reply.body.data.code).toBe('origin-required')
    expect(reply.body.message).toMatch(/Origin/)
    const script = await new Client(baseURL).request('POST', '/api/auth/login', { email: DEMO.lecturer, password: 'cyclodial-demo' }, { headers: { origin: '' } })
    expect(script.status).toBe(200)
  })

  it('refuses a JSON route sent a body that is not JSON (form posts and text/plain), with 403', async () => {
    for (const type of ['text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x', '']) {
      const reply = await tutor.request('POST', '/api/record-check', undefined, { raw: JSON.stringify(check), headers: { 'content-type': type || 'application/octet-stream' } })
      expect(reply.status, type).toBe(403)
      expect(reply.body.data.code).toBe('json-required')
    }
    expect((await tutor.request('POST', '/api/record-check', undefined, { raw: JSON.stringify(check), headers: { 'content-type': 'application/json; charset=utf-8' } })).status).toBe(200)
  })

  it('refuses a cross-origin upload even though uploads are multipart', async () => {
    const form = new FormData()
    form.append('file', new Blob(['name,email\nA B,a.b@cyclodial.test\n'], { type: 'text/csv' }), 'r.csv')
    const res = await fetch(`${baseURL}/api/roster/preview`, { method: 'POST', body: form, headers: { origin: 'http://evil.invalid' } })
    expect(res.status).toBe(403)
  })
})

describe('point 15: production posture', () => {
  it('sends Strict-Transport-Security only over HTTPS: through a trusted proxy saying https, never on a forged header without one', async () => {
    // the shared server trusts no proxy: a client's X-Forwarded-Proto changes nothing
    const plain = await fetch(`${baseURL}/api/health`, { headers: { 'x-forwarded-proto': 'https' } })
    expect(plain.headers.get('strict-transport-security')).toBeNull()

    const proxied = await startServer({ seed: false, env: { NUXT_TRUSTED_PROXIES: 'loopback', NUXT_MAIL_CATCHER: '0' } })
    try {
      const https = await fetch(`${proxied.baseURL}/login`, { headers: { 'x-forwarded-proto': 'https' } })
      // OWASP HTTP Strict Transport Security Cheat Sheet: max-age one year
      expect(https.headers.get('strict-transport-security')).toBe('max-age=31536000; includeSubDomains')
      const api = await fetch(`${proxied.baseURL}/api/health`, { headers: { 'x-forwarded-proto': 'https' } })
      expect(api.headers.get('strict-transport-security')).toMatch(/max-age=31536000/)
      const http = await fetch(`${proxied.baseURL}/api/health`, { headers: { 'x-forwarded-proto': 'http' } })
      expect(http.headers.get('strict-transport-security')).toBeNull()
    }
    finally { await proxied.stop() }
  }, 60_000)

  const exitOf = (password: string) => startUpExit({ NUXT_SESSION_PASSWORD: password })

  it('refuses to start with a session password that is long but trivially weak', async () => {
    for (const weak of ['a'.repeat(48), 'abcd'.repeat(10), 'password'.repeat(5), 'aabbccddaabbccddaabbccdd12121212']) {
      const { code, out } = await exitOf(weak)
      expect(code, weak).toBe(1)
      expect(out).toMatch(/NUXT_SESSION_PASSWORD/)
      expect(out).toMatch(/Refusing to start/)
    }
  }, 60_000)

  describe('the demo school in production', () => {
    let refused: RunningServer | undefined
    afterAll(async () => {
      await refused?.stop()
    })

    it('is not seeded by NUXT_SEED_DEMO=1 alone, and the log says why', async () => {
      refused = await startServer({ env: { NUXT_SEED_DEMO: '1', NUXT_SEED_DEMO_IN_PRODUCTION: '', NUXT_MAIL_CATCHER: '0' } })
      const db = readDb(refused.dbPath)
      expect(db.get('select count(*) as n from users')).toEqual({ n: 0 })
      db.close()
      expect(refused.output()).toMatch(/NUXT_SEED_DEMO_IN_PRODUCTION/)
      const signIn = await new Client(refused.baseURL).post('/api/auth/login', { email: DEMO.admin, password: 'cyclodial-demo' })
      expect(signIn.status).toBe(401)
    }, 60_000)

    it('is seeded with both flags, with a loud warning', async () => {
      const both = await startServer({ env: { NUXT_MAIL_CATCHER: '0' } }) // tests/support/server.ts sets both
      try {
        expect(both.output()).toMatch(/WARNING: seeding the DEMO SCHOOL on a PRODUCTION server/)
        await signedIn(both.baseURL, DEMO.admin)
      }
      finally { await both.stop() }
    }, 60_000)
  })

  it('pages the quiz list: page and pageSize with a total, a default and a maximum', async () => {
    const lecturer = await signedIn(baseURL, DEMO.lecturer)
    const all = await lecturer.get('/api/quizzes')
    expect(all.status).toBe(200)
    expect(all.body).toMatchObject({ page: 1, pageSize: 50 })
    expect(all.body.total).toBeGreaterThanOrEqual(2)
    const first = await lecturer.get('/api/quizzes?pageSize=1')
    const second = await lecturer.get('/api/quizzes?pageSize=1&page=2')
    expect(first.body.items).toHaveLength(1)
    expect(second.body.items).toHaveLength(1)
    expect(second.body.items[0].id).not.toBe(first.body.items[0].id)
    expect(first.body.total).toBe(all.body.total)
    const beyond = await lecturer.get(`/api/quizzes?pageSize=1&page=${all.body.total + 1}`)
    expect(beyond.body.items).toEqual([])
    for (const bad of ['pageSize=101', 'pageSize=0', 'page=0', 'page=x']) {
      const reply = await lecturer.get(`/api/quizzes?${bad}`)
      expect(reply.status, bad).toBe(400)
      expect(reply.body.data.fields[0].path).toBe(bad.split('=')[0])
    }
    const student = await signedIn(baseURL, 'adaeze.quillon@cyclodial.test')
    const mine = await student.get('/api/quizzes?pageSize=1')
    expect(mine.body.items.length).toBeLessThanOrEqual(1)
    expect(mine.body.total).toBeGreaterThanOrEqual(mine.body.items.length)
  })

  it('pages the casebook: the same page of templates and exact cases, each with its total', async () => {
    const lecturer = await signedIn(baseURL, DEMO.lecturer)
    for (const n of [1, 2]) {
      const made = await lecturer.post('/api/casebook/templates', { title: `Paging template ${n}`, templateId: 'so-palsy-right-standard' })
      expect(made.status, JSON.stringify(made.body)).toBe(201)
    }
    const first = await lecturer.get('/api/casebook?pageSize=1')
    expect(first.status).toBe(200)
    expect(first.body.templates).toHaveLength(1)
    expect(first.body.cases.length).toBeLessThanOrEqual(1)
    expect(first.body.templatesTotal).toBeGreaterThanOrEqual(2)
    expect(first.body).toMatchObject({ page: 1, pageSize: 1, casesTotal: expect.any(Number) })
    const second = await lecturer.get('/api/casebook?pageSize=1&page=2')
    expect(second.body.templates[0].id).not.toBe(first.body.templates[0].id)
    expect((await lecturer.get('/api/casebook')).body.pageSize).toBe(50)
    expect((await lecturer.get('/api/casebook?pageSize=500')).status).toBe(400)
  })
})
