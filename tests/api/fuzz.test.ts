// Malformed bodies to every state-changing API route (walked from server/api like
// the role matrix), each sent by a role that may call it, with real ids so the
// body is what the route judges. Any 5xx fails. Seeded, a few hundred bodies in all,
// on a server of its own so nothing it changes reaches the other tests.
import { readdirSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import fc from 'fast-check'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Role } from '#shared/auth/roles'
import { Client, DEMO, signedIn } from '../support/client'
import { cohortIds, minutesFromNow, publishQuiz } from '../support/quiz'
import { startServer } from '../support/server'
import type { RunningServer } from '../support/server'
import { ROUTE_ACCESS } from './route-access'

const SEED = 20261202
const RANDOM_BODIES = 240
const FIXED_BODIES = ['{', '[]', 'null', '"text"', '{"__proto__":{"polluted":true},"constructor":{"prototype":{}}}', '[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[1]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]']

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name)
    return statSync(full).isDirectory() ? routeFiles(full) : [full]
  })
}

/** server/api/admin/users/[id].patch.ts → ["PATCH", "/api/admin/users/[id]"] */
function routeOf(file: string): [string, string] {
  const rel = relative('server', file).replace(/\.ts$/, '')
  const match = rel.match(/^(.*?)(?:\.(get|post|put|patch|delete))?$/)!
  return [(match[2] ?? 'get').toUpperCase(), `/${match[1]!.replace(/\/index$/, '')}`]
}

const ROUTES = routeFiles('server/api').map(routeOf).filter(([method]) => method !== 'GET')

/** Field names the routes read, so random objects reach past "unknown shape". */
const FIELDS = ['title', 'name', 'email', 'password', 'token', 'cohortId', 'cohortIds', 'opensAt', 'closesAt', 'timeLimitMinutes', 'published', 'archived',
  'interpretation', 'feedback', 'kind', 'source', 'mode', 'templateId', 'template', 'difficulty', 'seed', 'spec', 'ranges', 'tolerance', 'weights', 'notes',
  'gaze', 'distance', 'readings', 'prisms', 'lights', 'record', 'trial', 'setting', 'torsion', 'attempt', 'eyes', 'disc', 'fovea', 'finding', 'reference',
  'marks', 'criterion', 'score', 'reason', 'itemId', 'attemptsAllowed', 'learnerIds', 'items', 'position', 'prompt', 'RE', 'LE', 'type', 'id']

const value = fc.jsonValue({ maxDepth: 3 })
const body = fc.oneof(
  fc.dictionary(fc.constantFrom(...FIELDS), value, { maxKeys: 6 }).map(o => JSON.stringify(o)),
  fc.dictionary(fc.constantFrom(...FIELDS), fc.dictionary(fc.constantFrom(...FIELDS), value, { maxKeys: 4 }), { maxKeys: 3 }).map(o => JSON.stringify(o)),
  value.map(v => JSON.stringify(v)),
  fc.string({ maxLength: 200 }), // mostly not JSON at all
  fc.constantFrom(...FIXED_BODIES),
)

describe('fuzz: malformed bodies to every state-changing route', () => {
  let server: RunningServer
  const clients = {} as Record<Role | 'stranger', Client>
  const ids: Record<string, string | number> = {}

  beforeAll(async () => {
    server = await startServer({ env: { NUXT_MAIL_CATCHER: '0' } })
    const base = server.baseURL
    clients.stranger = new Client(base)
    clients.admin = await signedIn(base, DEMO.admin)
    clients.lecturer = await signedIn(base, DEMO.lecturer)
    clients.tutor = await signedIn(base, DEMO.tutor)
    clients.student = await signedIn(base, DEMO.student)

    const cohorts = await cohortIds(clients.admin)
    const quiz = await publishQuiz(clients.tutor, { title: 'Fuzz', opensAt: minutesFromNow(-5), closesAt: minutesFromNow(120), cohortIds: [cohorts['Kestrel cohort']] },
      [{ kind: 'dmr', source: { type: 'engine', templateId: 'so-palsy-right-standard' }, mode: 'patient-turns' }])
    expect((await clients.student.post(`/api/quizzes/${quiz.id}/start`)).status).toBeLessThan(300)
    const practice = await clients.student.post('/api/practice', { template: 'so-palsy-right', seed: 'fuzz-1' })
    expect(practice.status).toBe(201)
    const template = await clients.tutor.post('/api/casebook/templates', { title: 'Fuzz template', templateId: 'so-palsy-right-standard' })
    expect(template.status).toBe(201)
    const cohort = await clients.admin.post('/api/admin/cohorts', { name: 'Fuzz cohort' })
    expect(cohort.status).toBe(201)
    const users = (await clients.admin.get('/api/admin/users?q=jory')).body.items as { id: number }[]
    Object.assign(ids, {
      quiz: quiz.id,
      item: quiz.items[0]!.id,
      practice: practice.body.id,
      template: template.body.id,
      cohort: cohort.body.id,
      user: users[0]!.id, // not one of the clients above
    })
  }, 120_000)

  afterAll(async () => {
    await server?.stop()
  })

  /** A URL with real ids for the route's own kind of thing (1 where there is none to hand). */
  function concrete(pattern: string): string {
    let url = pattern
    if (pattern.startsWith('/api/quizzes/')) url = url.replace('[id]', String(ids.quiz)).replace('[itemId]', String(ids.item))
    else if (pattern.startsWith('/api/practice/') || pattern.startsWith('/api/fundus/cases/')) url = url.replace('[id]', String(ids.practice))
    else if (pattern.startsWith('/api/casebook/templates/')) url = url.replace('[id]', String(ids.template))
    else if (pattern.startsWith('/api/admin/cohorts/')) url = url.replace('[id]', String(ids.cohort))
    else if (pattern.startsWith('/api/admin/users/')) url = url.replace('[id]', String(ids.user))
    return url.replace(/\[(?:id|itemId|attemptId|studentId)\]/g, '1').replace(/\[[^\]]+\]/g, 'fuzz-probe-token')
  }

  /** Who sends it: a role the route admits, the student where students may call it. */
  function sender(route: string): Client {
    const access = ROUTE_ACCESS[route]
    if (!access) throw new Error(`${route} is not in tests/api/route-access.ts`)
    if (access === 'public') return clients.stranger
    if (access === 'signed-in') return clients.student
    const order: Role[] = ['student', 'tutor', 'lecturer', 'admin']
    return clients[order.find(r => access.includes(r))!]
  }

  const statuses: Record<number, number> = {}

  async function send(method: string, pattern: string, raw: string): Promise<string | null> {
    const reply = await sender(`${method} ${pattern}`).request(method, concrete(pattern), undefined, { raw })
    statuses[reply.status] = (statuses[reply.status] ?? 0) + 1
    if (reply.status >= 500) return `${method} ${concrete(pattern)} ← ${JSON.stringify(raw).slice(0, 300)} → ${reply.status} ${JSON.stringify(reply.body).slice(0, 300)}`
    if (typeof reply.body === 'string' && /\bat .+\(.+:\d+:\d+\)/.test(reply.body)) return `${method} ${pattern}: a stack trace in the answer`
    return null
  }

  it('walks at least the state-changing routes the access table lists', () => {
    expect(ROUTES.length).toBeGreaterThan(30)
  })

  it('answers every route\'s fixed malformed bodies without a 5xx', async () => {
    const failures: string[] = []
    for (const [method, pattern] of ROUTES) {
      for (const raw of FIXED_BODIES) {
        const failure = await send(method, pattern, raw)
        if (failure) failures.push(failure)
      }
    }
    expect(failures).toEqual([])
  }, 120_000)

  it(`answers ${RANDOM_BODIES} random malformed bodies (seed ${SEED}) without a 5xx`, async () => {
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...ROUTES), body, async ([method, pattern], raw) => {
        const failure = await send(method, pattern, raw)
        if (failure) throw new Error(failure)
      }),
      { seed: SEED, numRuns: RANDOM_BODIES, endOnFailure: true },
    )
    // the bodies reached the routes' own checks: refusals at the door (401/403) are rare
    const total = Object.values(statuses).reduce((a, b) => a + b, 0)
    console.info(`fuzz: ${total} bodies, answers ${JSON.stringify(statuses)}`)
    expect(((statuses[401] ?? 0) + (statuses[403] ?? 0)) / total).toBeLessThan(0.1)
    expect((statuses[400] ?? 0) / total).toBeGreaterThan(0.6)
  }, 120_000)
})
