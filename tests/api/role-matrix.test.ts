import { readdirSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, inject, it } from 'vitest'
import { ROLES } from '#shared/auth/roles'
import type { Role } from '#shared/auth/roles'
import { Client, DEMO, signedIn } from '../support/client'
import { ROUTE_ACCESS } from './route-access'

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
})
