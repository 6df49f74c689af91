// Issue 12, point 1: links in e-mails come from NUXT_PUBLIC_SITE_URL only; a
// forged Host or X-Forwarded-* header changes nothing, and production refuses
// to start without the setting.
import { request } from 'node:http'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO, linkIn, signedIn, waitForMail } from '../support/client'
import { startServer, startUpExit, TEST_SESSION_PASSWORD, type RunningServer } from '../support/server'

const SITE = 'https://cyclodial.school.example'
const FORGED = {
  'host': 'attacker.example',
  'x-forwarded-host': 'attacker.example',
  'x-forwarded-proto': 'http',
  'x-forwarded-for': '203.0.113.9',
  // same-origin as far as the browser headers go: only Host is forged
  'origin': SITE,
  'sec-fetch-site': 'same-origin',
}

/** POST with a forged Host header (fetch would not send one). */
function forgedPost(baseURL: string, path: string, body: unknown, cookie = ''): Promise<number> {
  const url = new URL(path, baseURL)
  const payload = JSON.stringify(body)
  return new Promise((res, rej) => {
    const req = request({
      host: url.hostname,
      port: url.port,
      path: url.pathname,
      method: 'POST',
      headers: { ...FORGED, 'content-type': 'application/json', 'content-length': Buffer.byteLength(payload), ...(cookie ? { cookie } : {}) },
    }, (r) => {
      r.resume()
      r.on('end', () => res(r.statusCode ?? 0))
    })
    req.on('error', rej)
    req.end(payload)
  })
}

describe('links in e-mails', () => {
  let server: RunningServer
  beforeAll(async () => {
    server = await startServer({ env: { NUXT_PUBLIC_SITE_URL: `${SITE}/` } })
  })
  afterAll(async () => {
    await server?.stop()
  })

  it('builds reset and invitation links from the configured site, whatever Host the request forged', async () => {
    // the browser is on the configured site, so its Origin is the site's (the server only listens on the test port)
    const admin = await signedIn(server.baseURL, DEMO.admin, SITE)
    expect(await forgedPost(server.baseURL, '/api/auth/forgot', { email: 'noor.bramblecote@cyclodial.test' })).toBe(200)
    const reset = await waitForMail(admin, 'noor.bramblecote@cyclodial.test', /reset/i)
    expect(linkIn(reset.text, '/reset').startsWith(`${SITE}/reset/`)).toBe(true)
    expect(reset.text).not.toContain('attacker.example')

    const login = await fetch(`${server.baseURL}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: DEMO.admin, password: 'cyclodial-demo' }) })
    const cookie = login.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
    expect(await forgedPost(server.baseURL, '/api/admin/invitations', { email: 'forged.host@cyclodial.test', role: 'lecturer' }, cookie)).toBe(201)
    const invite = await waitForMail(admin, 'forged.host@cyclodial.test', /invited/i)
    expect(linkIn(invite.text, '/invite').startsWith(`${SITE}/invite/`)).toBe(true)
    expect(invite.text).not.toContain('attacker.example')
  })
})

describe('start-up without a site URL', () => {
  const exitOf = (env: Record<string, string>) => startUpExit({ NUXT_SESSION_PASSWORD: TEST_SESSION_PASSWORD, NUXT_PUBLIC_SITE_URL: '', ...env })

  it('refuses to start in production without NUXT_PUBLIC_SITE_URL, or with one that is not an http(s) URL', async () => {
    const missing = await exitOf({})
    expect(missing.code).toBe(1)
    expect(missing.out).toMatch(/NUXT_PUBLIC_SITE_URL/)
    const bad = await exitOf({ NUXT_PUBLIC_SITE_URL: 'javascript:alert(1)' })
    expect(bad.code).toBe(1)
    expect(bad.out).toMatch(/NUXT_PUBLIC_SITE_URL/)
  })
})
