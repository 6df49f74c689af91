// docs/api.md is written from the routes (scripts/api-doc.ts): it must list every
// handler and be exactly what the script writes today.
import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { apiDoc, routeOf } from '~~/scripts/api-doc'
import { ROUTE_ACCESS } from '../../api/route-access'

describe('docs/api.md', () => {
  it('names a route the way the role matrix does', () => {
    expect(routeOf(`${process.cwd()}/server/api/quizzes/[id]/items/index.post.ts`)).toBe('POST /api/quizzes/[id]/items')
    expect(routeOf(`${process.cwd()}/server/api/quizzes/[id]/results.csv.get.ts`)).toBe('GET /api/quizzes/[id]/results.csv')
  })

  it('is current: run `npm run docs:api` after adding or changing a route', () => {
    const doc = apiDoc()
    for (const key of Object.keys(ROUTE_ACCESS)) expect(doc).toContain(`\`${key}\``)
    expect(doc).not.toContain('not in route-access.ts')
    expect(readFileSync('docs/api.md', 'utf8')).toBe(doc)
  })
})
