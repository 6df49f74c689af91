// Writes docs/api.md from the routes themselves: every handler under server/api,
// who may call it (tests/api/route-access.ts, the same table the role-matrix test
// checks) and the first sentence of its header comment. `npm run docs:api`;
// tests/unit/docs/api-doc.test.ts fails when docs/api.md is not what this writes.
import { readdirSync, readFileSync, writeFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { fileURLToPath } from 'node:url'
import { ROUTE_ACCESS } from '../tests/api/route-access'

const root = fileURLToPath(new URL('..', import.meta.url))
const apiDir = join(root, 'server/api')

function handlers(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap(e =>
    e.isDirectory() ? handlers(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : [])
}

/** `server/api/quizzes/[id]/items/index.post.ts` → `POST /api/quizzes/[id]/items`. */
export function routeOf(file: string): string {
  const rel = relative(apiDir, file).replace(/\.ts$/, '')
  const method = rel.slice(rel.lastIndexOf('.') + 1).toUpperCase()
  const path = `/api/${rel.slice(0, rel.lastIndexOf('.'))}`.replace(/\/index$/, '')
  return `${method} ${path}`
}

/** The handler's header comment up to its first full stop or semicolon, at most ~90 characters. */
function summary(file: string): string {
  const lines: string[] = []
  for (const line of readFileSync(file, 'utf8').split('\n')) {
    if (!line.startsWith('//')) break
    lines.push(line.replace(/^\/\/\s?/, ''))
  }
  const text = lines.join(' ').replace(/^[A-Z]+ \/api\/\S+ \((?:[^()]|\([^()]*\))*\):\s*/, '')
  const end = text.search(/[.;](\s|$)/)
  let first = (end === -1 ? text : text.slice(0, end)).trim()
  if (first.length > 90) {
    first = first.slice(0, first.lastIndexOf(' ', 88))
    first = `${first}${(first.split('`').length - 1) % 2 ? '`' : ''} …`
  }
  return first.replace(/\|/g, '\\|')
}

const who = (key: string): string => {
  const access = ROUTE_ACCESS[key]
  if (access === undefined) return '**not in route-access.ts**'
  return access === 'public' ? 'anyone' : access === 'signed-in' ? 'signed in' : access.join(', ')
}

export function apiDoc(): string {
  const rows = handlers(apiDir)
    .map(file => ({ key: routeOf(file), file: relative(root, file) }))
    .sort((a, b) => a.key.split(' ')[1]!.localeCompare(b.key.split(' ')[1]!) || a.key.localeCompare(b.key))
  return [
    '# API',
    '',
    'Written by `npm run docs:api` from `server/api/` (do not edit by hand; a unit test compares).',
    'Each route links to its handler, whose header comment and typed return value are the',
    'reference; request bodies are the zod schemas in `shared/schemas/`, responses the types in',
    '`shared/types/`. Who may call a route comes from `tests/api/route-access.ts`.',
    '',
    'All routes take and return JSON (uploads are `multipart/form-data`). Bad input gets `400`',
    'naming the fields (`data.fields: [{ path, message }]`); no session `401`; the wrong role',
    '`403`; another person\'s data `404`. Errors carry a stable `data.code`. A `POST`, `PUT`,',
    '`PATCH` or `DELETE` must come from the site itself (`Origin` or `Sec-Fetch-Site`; a script',
    'without either may only send no cookie), JSON bodies must say `application/json` and stay',
    'under 1 MB (`413`); see the request guard in `server/utils/request-guard.ts`.',
    '',
    '| route | who | handler |',
    '| --- | --- | --- |',
    ...rows.map(r => `| \`${r.key}\` | ${who(r.key)} | [${r.file.replace('server/api/', '')}](../${encodeURI(r.file)}) ${summary(join(root, r.file))} |`),
    '',
  ].join('\n')
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  writeFileSync(join(root, 'docs/api.md'), apiDoc())
  console.log('docs/api.md written')
}
