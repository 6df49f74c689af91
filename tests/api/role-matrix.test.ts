import { readdirSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, inject, it } from 'vitest'
import { ROLES } from '#shared/auth/roles'
import type { Role } from '#shared/auth/roles'
import { Client, DEMO, signedIn } from '../support/client'
import { minutesFromNow, publishQuiz } from '../support/quiz'
import { CROSS_COHORT, ROUTE_ACCESS } from './route-access'

const baseURL = inject('baseURL')

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name)
    return statSync(full).isDirectory() ? routeFiles(full) : [full]
  })
}

/** server/api/admin/users/[id].patch.ts → "PATCH /api/admin/users/[id]" */
function routeKey(file: string): string {
  const rel = relative('server', file).replace(/\.ts$/, '')
  const match = rel.match(/^(.*?)(?:\.(get|post|put|patch|delete))?$/)!
  const method = (match[2] ?? 'get').toUpperCase()
  const path = `/${match[1]!.replace(/\/index$/, '')}`.replace(/\.(csv|json)$/, '.$1')
  return `${method} ${path}`
}

/** A concrete URL for a pattern: ids become 1, other params a harmless word. */
function concrete(path: string): string {
  return path.replace(/\[id\]/g, '1').replace(/\[[^\]]+\]/g, 'probe')
}

const routes = routeFiles('server/api').map(routeKey)
const staff = { admin: DEMO.admin, lecturer: DEMO.lecturer, tutor: DEMO.tutor, student: DEMO.student } satisfies Record<Role, string>

describe('role matrix over every API route', () => {
  it('lists every route file in the access table, and nothing stale', () => {
    const missing = routes.filter(r => !(r in ROUTE_ACCESS))
    expect(missing, 'add these routes to tests/api/route-access.ts').toEqual([])
    const stale = Object.keys(ROUTE_ACCESS).filter(r => !routes.includes(r))
    expect(stale, 'routes in the table with no file').toEqual([])
  })

  it('answers 401 to strangers and 403 to the wrong roles on protected routes', async () => {
    const clients = Object.fromEntries(await Promise.all(
      ROLES.map(async role => [role, await signedIn(baseURL, staff[role])] as const),
    )) as Record<Role, Client>
    const stranger = new Client(baseURL)
    const failures: string[] = []

    for (const route of routes) {
      const access = ROUTE_ACCESS[route]!
      if (access === 'public') continue
      const [method, pattern] = route.split(' ') as [string, string]
      const url = concrete(pattern)
      const body = method === 'GET' || method === 'DELETE' ? undefined : {}

      const anon = await stranger.request(method, url, body)
      if (anon.status !== 401) failures.push(`${route} as stranger → ${anon.status} (want 401)`)

      for (const role of ROLES) {
        const allowed = access === 'signed-in' || access.includes(role)
        const reply = await clients[role].request(method, url, body)
        if (allowed && (reply.status === 401 || reply.status === 403)) failures.push(`${route} as ${role} → ${reply.status} (want access)`)
        if (!allowed && reply.status !== 403) failures.push(`${route} as ${role} → ${reply.status} (want 403)`)
        if (reply.status >= 500) failures.push(`${route} as ${role} → ${reply.status} (server error)`)
      }
    }
    expect(failures).toEqual([])
  })

  it('keeps a tutor to their own cohorts on a quiz shared across cohorts (issue 12, point 7)', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const lecturer = await signedIn(baseURL, DEMO.lecturer)
    const owner = await signedIn(baseURL, DEMO.tutor) // teaches Kestrel, owns the quiz
    const other = await signedIn(baseURL, DEMO.tutor2) // teaches Heron only
    const cohorts = Object.fromEntries(((await admin.get('/api/admin/cohorts')).body.items as { id: number, name: string }[]).map(c => [c.name, c.id]))
    const quiz = await publishQuiz(owner, { title: 'Matrix: shared quiz', opensAt: minutesFromNow(-5), closesAt: minutesFromNow(60), cohortIds: [cohorts['Kestrel cohort']] }, [
      { kind: 'dmr', source: { type: 'engine', templateId: 'so-palsy-right-standard' }, mode: 'learner-turns' },
      { kind: 'fundus', source: { type: 'engine', templateId: 'so-palsy-right-standard' } },
    ])
    expect((await lecturer.patch(`/api/quizzes/${quiz.id}`, { cohortIds: [cohorts['Kestrel cohort'], cohorts['Heron cohort']] })).status).toBe(200)
    const [dmr, fundus] = quiz.items
    const email = 'wen.hallowby@cyclodial.test' // Kestrel
    const student = await signedIn(baseURL, email)
    const studentId = (await student.get('/api/auth/me')).body.user.id
    expect((await student.post(`/api/quizzes/${quiz.id}/start`)).status).toBe(200)
    const dmrAttempt = (await student.post(`/api/quizzes/${quiz.id}/items/${dmr!.id}/attempts`, { gaze: 'primary', distance: 'near', readings: { RE: 90, LE: 90 }, record: 'DMR, near, primary position: no torsion.' })).body.attemptId
    const eyes = (await owner.get(`/api/quizzes/${quiz.id}/items/${fundus!.id}/cases/${studentId}`)).body.presentation.eyes
    const marks = Object.fromEntries((['RE', 'LE'] as const).map(e => [e, { disc: eyes[e].disc, fovea: eyes[e].fovea, finding: 'within-normal' }]))
    const fundusAttempt = (await student.post(`/api/quizzes/${quiz.id}/items/${fundus!.id}/attempts`, { eyes: marks })).body.attemptId
    expect(dmrAttempt).toBeGreaterThan(0)
    expect(fundusAttempt).toBeGreaterThan(0)

    const staffQuizRoutes = Object.entries(ROUTE_ACCESS)
      .filter(([route, access]) => /^\w+ \/api\/quizzes\/\[id\]/.test(route) && (access === 'signed-in' || (access !== 'public' && access.includes('tutor'))))
      .map(([route]) => route)
    expect(staffQuizRoutes.filter(r => !(r in CROSS_COHORT)), 'add these routes to CROSS_COHORT in tests/api/route-access.ts').toEqual([])

    const bodies: Record<string, unknown> = {
      'PATCH /api/quizzes/[id]': { closesAt: minutesFromNow(600) },
      'POST /api/quizzes/[id]/items': { kind: 'dmr', source: { type: 'engine', templateId: 'normal-standard' } },
      'PATCH /api/quizzes/[id]/items/[itemId]': { prompt: 'Changed by another cohort\'s tutor' },
      'POST /api/quizzes/[id]/attempts/[attemptId]/overrides': { criterion: 'amount', score: 1, reason: 'Across cohorts' },
      'POST /api/quizzes/[id]/fundus-attempts/[attemptId]/overrides': { criterion: 'fundusAngle', score: 0, reason: 'Across cohorts' },
    }
    const failures: string[] = []
    for (const [route, want] of Object.entries(CROSS_COHORT)) {
      const [method, pattern] = route.split(' ') as [string, string]
      const url = pattern.replace('[id]', String(quiz.id))
        .replace('[itemId]', String(/fundus/.test(route) ? fundus!.id : dmr!.id))
        .replace('[studentId]', String(studentId))
        .replace('[attemptId]', String(/fundus-attempts/.test(route) ? fundusAttempt : dmrAttempt))
      const reply = await other.request(method, url, bodies[route] ?? (method === 'GET' || method === 'DELETE' ? undefined : {}))
      if (typeof want === 'number') {
        if (reply.status !== want) failures.push(`${route} → ${reply.status} (want ${want})`)
        if (want === 403 && !/owner/.test(reply.body?.message ?? '')) failures.push(`${route} → 403 without a message naming the owner`)
      }
      else if (reply.status >= 400) failures.push(`${route} → ${reply.status} (want access)`)
      else if (want === 'own-only' && JSON.stringify(reply.body).includes(email)) failures.push(`${route} lists another cohort's student`)
    }
    expect(failures).toEqual([])
    // nothing changed: the owner's settings, items and marks stand
    const after = (await owner.get(`/api/quizzes/${quiz.id}`)).body
    expect(Date.parse(after.closesAt)).toBe(Date.parse(quiz.closesAt))
    expect(after.items).toHaveLength(2)
    expect(after.releasedAt).toBeNull()
    expect((await owner.get(`/api/quizzes/${quiz.id}/attempts/${dmrAttempt}`)).body.overrides).toEqual([])
    expect((await owner.patch(`/api/quizzes/${quiz.id}`, { archived: true })).status).toBe(200)
  })
})
