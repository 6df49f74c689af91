// Two built instances on one PostgreSQL database and one S3-compatible photo store
// (a local fake), as behind a load balancer (issue 15, point 4): a session made on
// one works on the other, signing out on one ends it on both, a quiz autosaved
// through one is submitted through the other, a photo uploaded through one is
// served by the other, and the sign-in limit counts attempts made through both.
// Several instances need a shared database server, so this runs in the PostgreSQL
// tier only (npm run test:api:pg sets CYCLODIAL_TEST_PG_URL); one SQLite file
// belongs to one process by design.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, DEMO, signedIn } from '../support/client'
import { syntheticPng } from '../support/fundus'
import { createTestDatabase, testPgUrl, type TestDatabase } from '../support/pg'
import { cohortIds, minutesFromNow, publishQuiz } from '../support/quiz'
import { startS3Fake, type S3Fake } from '../support/s3-fake'
import { freePort, startServer, type RunningServer } from '../support/server'

describe.runIf(testPgUrl())('two instances on one PostgreSQL database', () => {
  let database: TestDatabase
  let s3: S3Fake
  let a: RunningServer
  let b: RunningServer
  let site: string

  beforeAll(async () => {
    database = await createTestDatabase(testPgUrl()!)
    s3 = await startS3Fake()
    // one public site in front of both (the load balancer's address)
    const portA = await freePort()
    site = `http://127.0.0.1:${portA}`
    const env = { ...s3.env, NUXT_PUBLIC_SITE_URL: site }
    // started together: one migrates and seeds while the other waits for it
    ;[a, b] = await Promise.all([
      startServer({ databaseUrl: database.url, port: portA, env }),
      startServer({ databaseUrl: database.url, env }),
    ])
  }, 120_000)

  afterAll(async () => {
    await a?.stop()
    await b?.stop()
    await s3?.stop()
    await database?.drop()
  })

  it('migrated and seeded the shared database once', async () => {
    const seeded = [a.output(), b.output()].filter(log => /demo school seeded/.test(log))
    expect(seeded).toHaveLength(1)
    const admin = await signedIn(a.baseURL, DEMO.admin)
    const users = (await admin.get('/api/admin/users?pageSize=100')).body
    const onB = (await admin.copyTo(b.baseURL).get('/api/admin/users?pageSize=100')).body
    expect(onB.total).toBe(users.total)
    expect(new Set(users.items.map((u: { email: string }) => u.email)).size).toBe(users.items.length)
  })

  it('a session made on one works on the other; signing out on one ends it on both', async () => {
    const onA = await signedIn(a.baseURL, DEMO.lecturer, site)
    const onB = onA.copyTo(b.baseURL)
    expect((await onB.get('/api/auth/me')).body.user.email).toBe(DEMO.lecturer)
    // the same cookie, kept aside, as a second tab or a copied cookie would be
    const kept = onA.copyTo(b.baseURL)
    expect((await onA.post('/api/auth/logout')).status).toBeLessThan(300)
    expect((await kept.get('/api/auth/me')).status).toBe(401)
    expect((await kept.copyTo(a.baseURL).get('/api/auth/me')).status).toBe(401)
  })

  it('a quiz autosaved through one is submitted through the other', async () => {
    const admin = await signedIn(a.baseURL, DEMO.admin, site)
    const tutor = await signedIn(a.baseURL, DEMO.tutor, site)
    const kestrel = (await cohortIds(admin))['Kestrel cohort']!
    const quiz = await publishQuiz(tutor, {
      title: 'Two instances',
      opensAt: minutesFromNow(-5),
      closesAt: minutesFromNow(60),
      attemptsAllowed: 1,
      cohortIds: [kestrel],
    }, [{ kind: 'dmr', prompt: 'Measure in primary position at near.', source: { type: 'engine', templateId: 'normal-standard' }, mode: 'learner-turns' }])
    const item = quiz.items[0]!
    const studentA = await signedIn(a.baseURL, DEMO.student, site)
    const studentB = studentA.copyTo(b.baseURL)
    expect((await studentA.post(`/api/quizzes/${quiz.id}/start`)).status).toBe(200)
    const draft = { gaze: 'primary', distance: 'near', readings: { RE: 92, LE: 88 }, prisms: [{ eye: 'RE', power: 4, base: 'down' }], lights: 'dim', record: 'DMR near primary RE 2 ex LE 2 in' }
    const saved = await studentA.put(`/api/quizzes/${quiz.id}/items/${item.id}/draft`, draft)
    expect(saved.status).toBe(200)
    const reloaded = await studentB.get(`/api/quizzes/${quiz.id}/items/${item.id}`)
    expect(reloaded.body.draft).toMatchObject(draft)
    const { savedAt: _savedAt, ...answer } = reloaded.body.draft
    const submitted = await studentB.post(`/api/quizzes/${quiz.id}/items/${item.id}/attempts`, answer)
    expect(submitted.status, JSON.stringify(submitted.body)).toBe(201)
    const seen = await studentA.get(`/api/quizzes/${quiz.id}/attempts/${submitted.body.attemptId}`)
    expect(seen.status).toBe(200)
    // and the other instance refuses a second submission of the same item
    expect((await studentA.post(`/api/quizzes/${quiz.id}/items/${item.id}/attempts`, answer)).status).toBe(409)
  })

  it('a photo uploaded through one is served by the other, and deleted through it', async () => {
    const tutorA = await signedIn(a.baseURL, DEMO.tutor, site)
    const tutorB = tutorA.copyTo(b.baseURL)
    const png = await syntheticPng()
    const form = new FormData()
    form.append('file', new Blob([new Uint8Array(png)], { type: 'image/png' }), 'fundus.png')
    for (const [k, v] of Object.entries({ title: 'Shared store', eye: 'LE', consent: 'yes' })) form.append(k, v)
    const up = await tutorA.postForm('/api/fundus/photos', form)
    expect(up.status, JSON.stringify(up.body)).toBe(201)
    const served = await tutorB.bytes(up.body.imageUrl)
    expect(served.status).toBe(200)
    expect(served.headers.get('content-type')).toBe('image/png')
    expect(Buffer.compare(served.body, (await tutorA.bytes(up.body.imageUrl)).body)).toBe(0)
    expect((await tutorB.delete(`/api/fundus/photos/${up.body.id}`)).status).toBe(200)
    expect((await tutorA.bytes(up.body.imageUrl)).status).toBe(404)
  })

  it('the sign-in limit counts attempts made through both', async () => {
    const tryOn = async (server: RunningServer, i: number) => (await new Client(server.baseURL, site).post('/api/auth/login', { email: DEMO.tutor2, password: `wrong-${i}` })).status
    // five failures, spread over both instances (MAX_FAILURES_PER_EMAIL_AND_IP = 5)
    expect([await tryOn(a, 1), await tryOn(b, 2), await tryOn(a, 3), await tryOn(b, 4), await tryOn(a, 5)]).toEqual([401, 401, 401, 401, 401])
    expect(await tryOn(b, 6)).toBe(429)
    expect(await tryOn(a, 7)).toBe(429)
  })
})
