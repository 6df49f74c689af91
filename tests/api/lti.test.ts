// LTI 1.3 against the built server and the practice platform (tests/support/lti-platform.ts):
// registering a platform, the login, each launch check failing on its own fault, people and
// courses, deep linking, and scores returned through AGS with retries.
// The server here is this file's own (retries after 1 s instead of 30 s).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, signedIn } from '../support/client'
import { PracticePlatform, type PracticePerson } from '../support/lti-platform'
import { minutesFromNow, publishQuiz } from '../support/quiz'
import { launchKit } from '../support/lti-launch'
import { startServer, type RunningServer } from '../support/server'

let server: RunningServer
let platform: PracticePlatform
let admin: Client
let platformId: number

beforeAll(async () => {
  server = await startServer({ env: { NUXT_MAIL_RETRY_SECONDS: '1' } })
  platform = new PracticePlatform(server.baseURL)
  await platform.start()
  admin = await signedIn(server.baseURL, DEMO.admin)
  const made = await admin.post('/api/admin/lti/platforms', platform.registration())
  expect(made.status, JSON.stringify(made.body)).toBe(201)
  platformId = made.body.id
}, 60_000)

afterAll(async () => {
  await platform?.stop()
  await server?.stop()
})

const { person, login, postLaunch, launch, accountsOf, until } = launchKit(() => ({ server, platform }))

describe('registering a learning platform', () => {
  it('lists it with the tool configuration to copy; refuses bad input naming the fields and a second registration', async () => {
    const list = await admin.get('/api/admin/lti/platforms')
    expect(list.status).toBe(200)
    expect(list.body.items.find((p: { id: number }) => p.id === platformId)).toMatchObject({ issuer: platform.issuer, clientId: platform.clientId, deploymentIds: [platform.deploymentId], disabled: false })
    expect(list.body.tool).toMatchObject({ loginUrl: `${server.baseURL}/api/lti/login`, launchUrl: `${server.baseURL}/api/lti/launch`, jwksUrl: `${server.baseURL}/api/lti/jwks`, redirectUris: [`${server.baseURL}/api/lti/launch`] })

    const before = list.body.items.length
    const bad = await admin.post('/api/admin/lti/platforms', { ...platform.registration('Bad'), issuer: 'ftp://platform.test', authUrl: 'http://platform.example/auth', deploymentIds: [] })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.map((f: { path: string }) => f.path)).toEqual(expect.arrayContaining(['issuer', 'authUrl', 'deploymentIds']))
    const again = await admin.post('/api/admin/lti/platforms', platform.registration('Twice'))
    expect(again.status).toBe(409)
    expect((await admin.get('/api/admin/lti/platforms')).body.items).toHaveLength(before)
  })

  it('publishes the tool key set with kids (RFC 7517 §5)', async () => {
    const jwks = await new Client(server.baseURL).get('/api/lti/jwks')
    expect(jwks.status).toBe(200)
    expect(jwks.body.keys.length).toBeGreaterThan(0)
    for (const key of jwks.body.keys) {
      expect(key).toMatchObject({ kty: 'RSA', alg: 'RS256', use: 'sig' })
      expect(key.kid).toBeTruthy()
      expect(key.d).toBeUndefined() // RFC 7518 §6.3.2.1: the private exponent never leaves
    }
  })
})

describe('the tool\'s key rotation', () => {
  it('a new key signs from then on; the old one stays published', async () => {
    const before = (await new Client(server.baseURL).get('/api/lti/jwks')).body.keys.map((k: { kid: string }) => k.kid)
    const rotated = await admin.post('/api/admin/lti/keys/rotate')
    expect(rotated.status).toBe(200)
    expect(before).not.toContain(rotated.body.kid)
    const after = (await new Client(server.baseURL).get('/api/lti/jwks')).body.keys.map((k: { kid: string }) => k.kid)
    expect(after).toEqual(expect.arrayContaining([...before, rotated.body.kid]))
    expect((await (await signedIn(server.baseURL, DEMO.tutor)).post('/api/admin/lti/keys/rotate')).status).toBe(403)
  })
})

describe('login initiation (LTI Core 1.3 §4.1)', () => {
  it('redirects to the authorisation URL with the OIDC parameters and a fresh state and nonce', async () => {
    const browser = new Client(server.baseURL)
    const { auth, state, nonce } = await login(browser, person())
    expect(auth.origin + auth.pathname).toBe(platform.authUrl)
    const q = Object.fromEntries(auth.searchParams)
    // LTI Security Framework 1.0 §5.1.1.2 / OpenID Connect Core 1.0 §3.1.2.1
    expect(q).toMatchObject({ scope: 'openid', response_type: 'id_token', response_mode: 'form_post', prompt: 'none', client_id: platform.clientId, redirect_uri: `${server.baseURL}/api/lti/launch` })
    expect(q.login_hint).toMatch(/^p-learner-/)
    expect(q.lti_message_hint).toBeTruthy()
    expect(state.length).toBeGreaterThanOrEqual(32)
    expect(nonce.length).toBeGreaterThanOrEqual(32)
    expect(nonce).not.toBe(state)
    const second = await login(browser, person())
    expect(second.state).not.toBe(state)
    expect(second.nonce).not.toBe(nonce)
  })

  it('refuses an unknown issuer, a target on another site and an unknown deployment with a page and a 4xx', async () => {
    const browser = new Client(server.baseURL)
    const base = new URL(platform.loginUrl('student', 'link'))
    const variant = (change: (u: URL) => void) => {
      const u = new URL(base)
      change(u)
      return browser.request('GET', `${u.pathname}${u.search}`, undefined, { headers: { accept: 'text/html' } })
    }
    const cases: [string, (u: URL) => void, number][] = [
      ['unknown-platform', u => u.searchParams.set('iss', 'https://unknown-platform.test'), 400],
      ['bad-target', u => u.searchParams.set('target_link_uri', 'https://elsewhere.test/'), 400],
      ['unknown-deployment', u => u.searchParams.set('lti_deployment_id', 'not-registered'), 403],
      ['missing-parameter', u => u.searchParams.delete('login_hint'), 400],
    ]
    for (const [code, change, status] of cases) {
      const reply = await variant(change)
      expect(reply.status, code).toBe(status)
      expect(reply.headers.get('x-lti-refusal')).toBe(code)
      expect(reply.headers.get('content-type')).toContain('text/html')
      expect(String(reply.body)).toContain('refused')
    }
  })

  it('inside a frame offers a new window, framable by the platform only', async () => {
    const browser = new Client(server.baseURL)
    const u = new URL(platform.loginUrl('student', 'link'))
    const reply = await browser.request('GET', `${u.pathname}${u.search}`, undefined, { headers: { 'sec-fetch-dest': 'iframe', 'accept': 'text/html' } })
    expect(reply.status).toBe(200)
    expect(reply.headers.get('content-security-policy')).toContain(`frame-ancestors ${platform.issuer}`)
    expect(reply.headers.get('x-frame-options')).toBeNull()
    expect(String(reply.body)).toMatch(/target="_blank"/)
    expect(String(reply.body)).toContain('/api/lti/login?')
  })
})

describe('launch checks, each failing on its own fault', () => {
  it('a correct launch signs a learner in as a student, linked by issuer and subject', async () => {
    const browser = new Client(server.baseURL)
    const who = person()
    const landed = await launch(browser, who)
    expect(landed).toBe('/student')
    const me = await browser.get('/api/auth/me')
    expect(me.status).toBe(200)
    expect(me.body.user ?? me.body).toMatchObject({ role: 'student', name: who.name, email: who.email })
    // a second launch finds the same account
    const again = new Client(server.baseURL)
    await launch(again, who)
    expect(accountsOf(who.email)).toBe(1)
    expect((await again.get('/api/auth/me')).body).toEqual(me.body)
  })

  it('an instructor becomes a tutor; a platform administrator is never signed in', async () => {
    const tutor = person('instructor')
    const browser = new Client(server.baseURL)
    const landed = await launch(browser, tutor)
    expect(landed).toMatch(/^\/lti\/course\?launch=/) // a new course: the tutor links it to a cohort first
    const me = (await browser.get('/api/auth/me')).body
    expect(me.user?.role ?? me.role).toBe('tutor')

    const root = person('administrator')
    const other = new Client(server.baseURL)
    const { state, nonce } = await login(other, root)
    const refused = await postLaunch(other, { id_token: await platform.idToken({ nonce, person: root }), state })
    expect(refused.status).toBe(403)
    expect(refused.headers.get('x-lti-refusal')).toBe('no-usable-role')
    expect(accountsOf(root.email)).toBe(0)
  })

  // Each row: one fault; everything else is a correct launch. The check that catches it
  // is named by its code (the response header X-Lti-Refusal).
  const faults: { name: string, code: string, status: number, token: (nonce: string, who: PracticePerson) => Promise<string> }[] = [
    { name: 'bad signature', code: 'bad-signature', status: 401, token: (nonce, who) => platform.idToken({ nonce, person: who, keyFault: 'bad-signature' }) },
    { name: 'unknown key id', code: 'unknown-kid', status: 401, token: (nonce, who) => platform.idToken({ nonce, person: who, keyFault: 'unknown-kid' }) },
    { name: 'wrong audience', code: 'wrong-audience', status: 401, token: (nonce, who) => platform.idToken({ nonce, person: who, aud: 'another-tool' }) },
    { name: 'several audiences without azp', code: 'wrong-audience', status: 401, token: (nonce, who) => platform.idToken({ nonce, person: who, aud: [platform.clientId, 'another-tool'] }) }, // OpenID Connect Core 1.0 §3.1.3.7 item 4
    { name: 'expired', code: 'expired', status: 401, token: (nonce, who) => platform.idToken({ nonce, person: who, issuedAt: Math.floor(Date.now() / 1000) - 400, expiresIn: 200 }) }, // exp 200 s ago, beyond the 60 s skew
    { name: 'unknown deployment', code: 'unknown-deployment', status: 403, token: (nonce, who) => platform.idToken({ nonce, person: who, deploymentId: 'deployment-not-registered' }) },
    { name: 'wrong message type', code: 'wrong-message-type', status: 400, token: (nonce, who) => platform.idToken({ nonce, person: who, messageType: 'LtiSubmissionReviewRequest' }) },
    { name: 'wrong version', code: 'wrong-version', status: 400, token: (nonce, who) => platform.idToken({ nonce, person: who, version: '1.1.0' }) },
    { name: 'missing roles', code: 'missing-roles', status: 400, token: (nonce, who) => platform.idToken({ nonce, person: who, omit: ['https://purl.imsglobal.org/spec/lti/claim/roles'] }) },
    { name: 'another issuer', code: 'wrong-issuer', status: 401, token: (nonce, who) => platform.idToken({ nonce, person: who, iss: 'https://impostor-platform.test' }) },
    { name: 'a nonce from another login', code: 'nonce-mismatch', status: 401, token: (_nonce, who) => platform.idToken({ nonce: 'a-nonce-this-login-never-sent', person: who }) },
  ]
  for (const fault of faults) {
    it(`refuses: ${fault.name} (${fault.code})`, async () => {
      const browser = new Client(server.baseURL)
      const who = person()
      const { state, nonce } = await login(browser, who)
      const reply = await postLaunch(browser, { id_token: await fault.token(nonce, who), state })
      expect(reply.status).toBe(fault.status)
      expect(reply.headers.get('x-lti-refusal')).toBe(fault.code)
      expect(reply.headers.get('content-type')).toContain('text/html')
      expect(String(reply.body)).toContain('Nothing was changed')
      expect(accountsOf(who.email)).toBe(0)
      expect((await browser.get('/api/auth/me')).status).toBe(401)
    })
  }

  it('refuses a replayed nonce: the same id_token presented again with a new login', async () => {
    const browser = new Client(server.baseURL)
    const who = person()
    const first = await login(browser, who)
    const token = await platform.idToken({ nonce: first.nonce, person: who })
    expect((await postLaunch(browser, { id_token: token, state: first.state })).status).toBe(303)
    // an attacker who captured the token starts a login of their own and posts it
    const attacker = new Client(server.baseURL)
    const second = await login(attacker, who)
    const replay = await postLaunch(attacker, { id_token: token, state: second.state })
    expect(replay.status).toBe(401)
    expect(replay.headers.get('x-lti-refusal')).toBe('replayed-nonce')
    // and the same state cannot be used twice either
    const again = await postLaunch(browser, { id_token: token, state: first.state })
    expect(again.status).toBe(400)
    expect(again.headers.get('x-lti-refusal')).toBe('state-used')
  })

  it('refuses a launch form above 64 KB before reading it all (413), and a form post without fields (400)', async () => {
    const browser = new Client(server.baseURL)
    const big = await postLaunch(browser, { id_token: 'x'.repeat(70 * 1024), state: 'whatever' })
    expect(big.status).toBe(413)
    expect(big.headers.get('x-lti-refusal')).toBe('body-too-large')
    const empty = await postLaunch(browser, {})
    expect(empty.status).toBe(400)
    expect(empty.headers.get('x-lti-refusal')).toBe('missing-parameter')
  })

  it('a launch is finished only in the browser that started it', async () => {
    const browser = new Client(server.baseURL)
    const who = person()
    const { state, nonce } = await login(browser, who)
    const posted = await postLaunch(browser, { id_token: await platform.idToken({ nonce, person: who }), state })
    expect(posted.status).toBe(303)
    const elsewhere = new Client(server.baseURL)
    const refused = await elsewhere.request('GET', posted.headers.get('location')!, undefined, { headers: { accept: 'text/html' } })
    expect(refused.status).toBe(403)
    expect(refused.headers.get('x-lti-refusal')).toBe('other-browser')
    expect((await elsewhere.get('/api/auth/me')).status).toBe(401)
  })

  it('a learner cannot answer a deep-linking request, and no account is made for trying', async () => {
    const browser = new Client(server.baseURL)
    const who = person()
    const { state, nonce } = await login(browser, who, 'deep')
    const posted = await postLaunch(browser, { id_token: await platform.idToken({ nonce, person: who, messageType: 'LtiDeepLinkingRequest' }), state })
    expect(posted.status).toBe(303)
    const refused = await browser.request('GET', posted.headers.get('location')!, undefined, { headers: { accept: 'text/html' } })
    expect(refused.status).toBe(403)
    expect(refused.headers.get('x-lti-refusal')).toBe('not-an-instructor')
    expect(accountsOf(who.email)).toBe(0)
  })

  it('picks up the platform\'s new key after a rotation (the key set is fetched again for an unknown kid)', async () => {
    await platform.rotateKey()
    await new Promise(r => setTimeout(r, 5200)) // past the 5 s cool-down of the cached key set
    const landed = await launch(new Client(server.baseURL), person())
    expect(landed).toBe('/student')
  }, 20_000)

  it('a disabled platform launches nobody', async () => {
    const spare = new PracticePlatform(server.baseURL)
    await spare.start()
    try {
      const made = await admin.post('/api/admin/lti/platforms', spare.registration('Spare platform'))
      expect(made.status).toBe(201)
      expect((await admin.patch(`/api/admin/lti/platforms/${made.body.id}`, { disabled: true })).body.disabled).toBe(true)
      const browser = new Client(server.baseURL)
      const u = new URL(spare.loginUrl('student', 'link'))
      const reply = await browser.request('GET', `${u.pathname}${u.search}`, undefined, { headers: { accept: 'text/html' } })
      expect(reply.status).toBe(400)
      expect(reply.headers.get('x-lti-refusal')).toBe('unknown-platform')
    }
    finally {
      await spare.stop()
    }
  })
})

describe('courses, deep linking and grades back', () => {
  it('a tutor links the course to a new cohort, deep-links a quiz; a learner sits it; released and overridden scores reach the line item', async () => {
    // the tutor launches from the course for the first time
    const tutorWho = person('instructor')
    const tutor = new Client(server.baseURL)
    const first = await launch(tutor, tutorWho, 'deep')
    expect(first).toMatch(/^\/lti\/course\?launch=/)
    const launchId = new URL(first, server.baseURL).searchParams.get('launch')!
    const about = await tutor.get(`/api/lti/launches/${launchId}`)
    expect(about.status).toBe(200)
    expect(about.body).toMatchObject({ messageType: 'LtiDeepLinkingRequest', course: { title: platform.course.title, cohortId: null }, cohorts: [] })
    expect((await tutor.post(`/api/lti/launches/${launchId}/course`, { newCohortName: '' })).body.data.fields[0].path).toBe('newCohortName')
    const linked = await tutor.post(`/api/lti/launches/${launchId}/course`, { newCohortName: `Practice course cohort ${Date.now()}` })
    expect(linked.status, JSON.stringify(linked.body)).toBe(200)
    expect(linked.body.next).toBe(`/lti/deep-link?launch=${launchId}`)
    expect((await tutor.post(`/api/lti/launches/${launchId}/course`, { cohortId: linked.body.cohortId })).status).toBe(409)
    // another person cannot use this launch
    expect((await (await signedIn(server.baseURL, DEMO.tutor)).get(`/api/lti/launches/${launchId}`)).status).toBe(404)

    // the tutor's quiz (made in Cyclodial) for the course's cohort
    const quiz = await publishQuiz(tutor, { title: 'Platform quiz', opensAt: minutesFromNow(-2), closesAt: minutesFromNow(30), cohortIds: [linked.body.cohortId] },
      [{ kind: 'dmr', source: { type: 'engine', templateId: 'so-palsy-right-standard' }, mode: 'learner-turns' }])

    // the choice: an HTML form post from the page, answered by a form that posts to the platform
    const choose = (quizId: string) => tutor.request('POST', `/api/lti/launches/${launchId}/deep-link`, undefined, { raw: new URLSearchParams({ quizId }).toString(), headers: { 'content-type': 'application/x-www-form-urlencoded', 'accept': 'text/html' } })
    expect((await choose('not-a-number')).status).toBe(400)
    // a quiz the tutor does not manage is refused with a page, and nothing goes to the platform
    const demoQuiz = (await (await signedIn(server.baseURL, DEMO.tutor)).get('/api/quizzes?pageSize=5')).body.items[0]
    const foreign = await choose(String(demoQuiz.id))
    expect([403, 404]).toContain(foreign.status)
    expect(String(foreign.body)).not.toContain('name="JWT"')
    const chosen = await choose(String(quiz.id))
    expect(chosen.status, String(chosen.body)).toBe(200)
    expect(chosen.headers.get('content-security-policy')).toContain(`form-action ${platform.issuer}`)
    const page = String(chosen.body)
    expect(page).toContain(`action="${platform.issuer}/deep-link-return"`)
    const jwt = /name="JWT" value="([^"]+)"/.exec(page)![1]!
    // signed with the newest published key (after the rotation above)
    const header = JSON.parse(Buffer.from(jwt.split('.')[0]!, 'base64url').toString('utf8'))
    expect(header.kid).toBe((await new Client(server.baseURL).get('/api/lti/jwks')).body.keys[0].kid)
    const returned = await fetch(`${platform.issuer}/deep-link-return`, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: new URLSearchParams({ JWT: jwt }) })
    expect(returned.status).toBe(200)
    const link = [...platform.links.values()].at(-1)!
    expect(link.custom).toEqual({ cyclodial_quiz: String(quiz.id) })
    const lineItem = platform.lineItems.get(link.lineItemId!)!
    const max = (await tutor.get(`/api/quizzes/${quiz.id}/results`)).body.columns.reduce((s: number, c: { possible: number }) => s + c.possible, 0)
    expect(lineItem).toMatchObject({ label: 'Platform quiz', scoreMaximum: max })
    expect(max).toBeGreaterThan(0)

    // a learner launches from the link: joins the course's cohort and lands on the quiz
    const learnerWho = person()
    const learner = new Client(server.baseURL)
    expect(await launch(learner, learnerWho, 'link', link.id)).toBe(`/student/quizzes/${quiz.id}`)
    expect((await learner.post(`/api/quizzes/${quiz.id}/start`)).status).toBeLessThan(300)
    const item = quiz.items[0]!
    const sent = await learner.post(`/api/quizzes/${quiz.id}/items/${item.id}/attempts`, { gaze: 'primary', distance: 'near', readings: { RE: 96, LE: 89 }, record: 'DMR, near, primary position: RE 6° excyclotorsion, LE 1° excyclotorsion' })
    expect(sent.status, JSON.stringify(sent.body)).toBe(201)
    expect((await learner.post(`/api/quizzes/${quiz.id}/finish`)).status).toBeLessThan(300)

    // release: the score goes to the line item
    expect((await tutor.patch(`/api/quizzes/${quiz.id}`, { closesAt: minutesFromNow(-0.01) })).status).toBe(200)
    const released = await tutor.post(`/api/quizzes/${quiz.id}/release`)
    expect(released.status, JSON.stringify(released.body)).toBe(200)
    expect(released.body.gradesQueued).toBe(1)
    const results = (await tutor.get(`/api/quizzes/${quiz.id}/results`)).body
    const row = results.items.find((r: { name: string }) => r.name === learnerWho.name)
    await until(() => platform.scores.some(s => s.userId === learnerWho.sub))
    const score = platform.scores.find(s => s.userId === learnerWho.sub)!
    expect(score).toMatchObject({ lineItemId: lineItem.id, scoreGiven: Math.round(row.earned * 100) / 100, scoreMaximum: max, activityProgress: 'Completed', gradingProgress: 'FullyGraded' })
    const log = await tutor.get(`/api/quizzes/${quiz.id}/lti-grades`)
    expect(log.body.items[0]).toMatchObject({ studentName: learnerWho.name, status: 'sent', reason: 'release' })

    // an override after release: the platform is down once, the retry delivers the new score
    platform.failNextScores = 1
    const attemptId = row.items[item.id].attemptId
    const before = platform.scores.length
    const changed = await tutor.post(`/api/quizzes/${quiz.id}/attempts/${attemptId}/overrides`, { criterion: 'test', score: 0, reason: 'Marked again after release' })
    expect(changed.status, JSON.stringify(changed.body)).toBe(201)
    const waiting = (await tutor.get(`/api/quizzes/${quiz.id}/lti-grades`)).body.items[0]
    expect(waiting).toMatchObject({ reason: 'override', status: 'pending', attempts: 1 })
    expect(waiting.lastError).toContain('503')
    await until(() => platform.scores.length > before, 15_000)
    const after = (await tutor.get(`/api/quizzes/${quiz.id}/results`)).body.items.find((r: { name: string }) => r.name === learnerWho.name)
    expect(platform.scores.at(-1)).toMatchObject({ userId: learnerWho.sub, scoreGiven: Math.round(after.earned * 100) / 100 })
    expect(after.earned).toBeLessThan(row.earned)
    expect((await tutor.get(`/api/quizzes/${quiz.id}/lti-grades`)).body.items[0]).toMatchObject({ status: 'sent', attempts: 2 })
    // administrators see the same log
    expect((await admin.get('/api/admin/lti/grades')).body.items.some((g: { quizId: number }) => g.quizId === quiz.id)).toBe(true)
    // a student never sees it
    expect((await learner.get(`/api/quizzes/${quiz.id}/lti-grades`)).status).toBe(403)
  }, 60_000)
})
