// Every audit action the server writes, read from the code (writeAudit calls under
// server/), so tests never keep the list by hand.
import { readFileSync, readdirSync, statSync } from 'node:fs'
import { join } from 'node:path'

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f)
    return statSync(p).isDirectory() ? files(p) : p.endsWith('.ts') ? [p] : []
  })
}

export function writtenAuditActions(root = 'server'): string[] {
  const found = new Set<string>()
  for (const f of files(root)) {
    const src = readFileSync(f, 'utf8')
    for (const m of src.matchAll(/action: '([a-z-]+\.[a-z-]+)'/g)) found.add(m[1]!)
    if (src.includes('action: `user.')) {
      // server/api/admin/users/[id].patch.ts writes user.<field>-changed for each changed field
      for (const field of ['name', 'role', 'disabled', 'cohorts']) found.add(`user.${field}-changed`)
    }
  }
  return [...found].sort()
}
