// Issue 12, point 6: sign-in limits that hold under a burst and cannot be turned
// on others. Each case runs on its own server: the limits last 15 minutes.
import { describe, expect, it } from 'vitest'
import { DEMO } from '../support/client'
import { startServer } from '../support/server'

async function login(baseURL: string, email: string, password: string, headers: Record<string, string> = {}): Promise<number> {
  const res = await fetch(`${baseURL}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'accept': 'application/json', ...headers },
    body: JSON.stringify({ email, password }),
  })
  await res.arrayBuffer()
  return res.status
}

describe('sign-in limits', () => {
  it('reserves each attempt before checking the password: of 20 simultaneous wrong passwords at most 5 are checked', async () => {
    const server = await startServer()
    try {
      const statuses = await Promise.all(Array.from({ length: 20 }, (_, i) => login(server.baseURL, DEMO.student, `wrong-guess-${i}`)))
      const checked = statuses.filter(s => s === 401).length
      const refused = statuses.filter(s => s === 429).length
      expect(checked + refused).toBe(20)
      expect(checked).toBeLessThanOrEqual(5) // MAX_FAILURES_PER_EMAIL_AND_IP
      expect(refused).toBeGreaterThanOrEqual(15)
    }
    finally { await server.stop() }
  })

  it('failures against many e-mails from one address slow it down but never block the right password of an account it did not attack', async () => {
    const server = await startServer()
    try {
      // 40 wrong passwords, each against a different e-mail, in bursts
      for (let batch = 0; batch < 4; batch++) {
        const statuses = await Promise.all(Array.from({ length: 10 }, (_, i) => login(server.baseURL, `sprayed-${batch}-${i}@cyclodial.test`, 'Spring2026!')))
        expect(statuses.every(s => s === 401), `batch ${batch}: ${statuses.join(',')}`).toBe(true)
      }
      const started = Date.now()
      expect(await login(server.baseURL, DEMO.tutor, 'cyclodial-demo')).toBe(200)
      // slowed, not blocked (server/utils/rate-limit.ts: at most 2 s)
      expect(Date.now() - started).toBeGreaterThanOrEqual(1000)
      // the attacked e-mails themselves stay limited per address
      await Promise.all(Array.from({ length: 5 }, (_, i) => login(server.baseURL, 'sprayed-9-9@cyclodial.test', `wrong-${i}`)))
      expect(await login(server.baseURL, 'sprayed-9-9@cyclodial.test', 'wrong-again')).toBe(429)
    }
    finally { await server.stop() }
  }, 90_000)

  it('reads X-Forwarded-For only from a configured trusted proxy', async () => {
    const direct = await startServer()
    try {
      // no trusted proxy: a forged header cannot buy fresh attempts
      for (let i = 0; i < 5; i++) {
        expect(await login(direct.baseURL, DEMO.tutor2, `wrong-${i}`, { 'x-forwarded-for': `198.51.100.${i + 1}` })).toBe(401)
      }
      expect(await login(direct.baseURL, DEMO.tutor2, 'wrong-5', { 'x-forwarded-for': '198.51.100.77' })).toBe(429)
    }
    finally { await direct.stop() }

    const proxied = await startServer({ env: { NUXT_TRUSTED_PROXIES: '127.0.0.1' } })
    try {
      // behind a trusted proxy: each client address has its own count, so one
      // client's failures do not block another's sign-in
      for (let i = 0; i < 5; i++) {
        expect(await login(proxied.baseURL, DEMO.tutor2, `wrong-${i}`, { 'x-forwarded-for': '198.51.100.1' })).toBe(401)
      }
      expect(await login(proxied.baseURL, DEMO.tutor2, 'wrong-5', { 'x-forwarded-for': '198.51.100.1' })).toBe(429)
      expect(await login(proxied.baseURL, DEMO.tutor2, 'cyclodial-demo', { 'x-forwarded-for': '198.51.100.2' })).toBe(200)
    }
    finally { await proxied.stop() }
  }, 90_000)
})
