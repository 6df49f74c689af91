import { describe, expect, inject, it } from 'vitest'
import { Client, DEMO, signedIn } from '../support/client'

const baseURL = inject('baseURL')

describe('sign-in and sign-out', () => {
  it('signs each demo role in and reports its home', async () => {
    for (const [role, email] of Object.entries({ admin: DEMO.admin, lecturer: DEMO.lecturer, tutor: DEMO.tutor, student: DEMO.student })) {
      const client = new Client(baseURL)
      const reply = await client.signIn(email)
      expect(reply.body.user.role).toBe(role)
      expect(reply.body.home).toBe(`/${role}`)
      const me = await client.get('/api/auth/me')
      expect(me.status).toBe(200)
      expect(me.body.user.email).toBe(email)
    }
  })

  it('uses a sealed cookie, not readable user data', async () => {
    const client = new Client(baseURL)
    const reply = await client.signIn(DEMO.student)
    const cookie = reply.headers.getSetCookie().join(';')
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).not.toContain('student@cyclodial.test')
    expect(cookie).not.toContain(encodeURIComponent('student@cyclodial.test'))
  })

  it('signs out', async () => {
    const client = await signedIn(baseURL, DEMO.tutor)
    expect((await client.post('/api/auth/logout')).status).toBe(200)
    expect((await client.get('/api/auth/me')).status).toBe(401)
  })

  it('refuses a malformed body with 400 naming the fields', async () => {
    const client = new Client(baseURL)
    const missing = await client.post('/api/auth/login', { email: 'not-an-email' })
    expect(missing.status).toBe(400)
    const paths = missing.body.data.fields.map((f: { path: string }) => f.path)
    expect(paths).toEqual(expect.arrayContaining(['email', 'password']))
    expect(missing.body.message).toMatch(/email/i)
    expect(missing.body.stack).toBeUndefined()

    const broken = await client.request('POST', '/api/auth/login', undefined, { raw: '{"email": "a@b.c",' })
    expect(broken.status).toBe(400)
    expect(broken.body.message).toMatch(/not valid JSON/)
    expect(broken.body.data.code).toBe('malformed-json')

    const wrongType = await client.post('/api/auth/login', ['email', 'password'])
    expect(wrongType.status).toBe(400)
  })

  it('answers unknown e-mail and wrong password with the same message', async () => {
    const client = new Client(baseURL)
    const unknown = await client.post('/api/auth/login', { email: 'nobody-here@cyclodial.test', password: 'whatever-123' })
    const wrong = await client.post('/api/auth/login', { email: DEMO.lecturer, password: 'not-the-password' })
    expect(unknown.status).toBe(401)
    expect(wrong.status).toBe(401)
    expect(unknown.body.message).toBe(wrong.body.message)
  })

  it('blocks the sixth failure in a row with 429 and Retry-After', async () => {
    const client = new Client(baseURL)
    // an account no other test signs in as: the block lasts 15 minutes, for every test after this one
    const email = 'ines.calloway@cyclodial.test'
    for (let i = 1; i <= 5; i++) {
      const r = await client.post('/api/auth/login', { email, password: `wrong-${i}` })
      expect(r.status, `attempt ${i}`).toBe(401)
    }
    const sixth = await client.post('/api/auth/login', { email, password: 'wrong-6' })
    expect(sixth.status).toBe(429)
    expect(Number(sixth.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(sixth.body.message).toMatch(/Too many failed sign-ins/)
    // Even the right password waits out the block.
    const right = await client.post('/api/auth/login', { email, password: 'cyclodial-demo' })
    expect(right.status).toBe(429)
  })

  it('sends security headers and no stack traces', async () => {
    const client = new Client(baseURL)
    const page = await fetch(`${baseURL}/login`)
    const csp = page.headers.get('content-security-policy') ?? ''
    expect(csp).toContain('frame-ancestors \'none\'')
    expect(csp).not.toContain('unsafe-eval')
    expect(page.headers.get('referrer-policy')).toBeTruthy()
    const missing = await client.get('/api/no-such-route')
    expect(missing.status).toBe(404)
    expect(JSON.stringify(missing.body)).not.toMatch(/at .*\.mjs:\d+/)
  })
})
