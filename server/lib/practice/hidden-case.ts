// Hidden cases (the server chose the template: practice "any", "another like this"
// of a hidden case, practice sets) are generated from a seed keyed with a
// server-side secret, so nothing the browser can know — a seed it sent, a set's
// number, its own id — can be replayed with a named template to find which
// template it is. The derived seed is stored on the case row (regeneration reads
// the row, never the secret again) and is not sent while the template is hidden.
// The words and look keys the browser gets are hashes of template and this
// derived seed, so they cannot be recomputed without the secret either.
import { createHmac, randomBytes } from 'node:crypto'

// The session password is the server's secret already (required in production,
// generated once in development); a random per-process key covers code run
// outside the server (unit tests), where nothing is stored for later.
let fallback: string | null = null
function caseSecret(): string {
  const configured = process.env.NUXT_SESSION_PASSWORD
  if (configured) return configured
  fallback ??= randomBytes(32).toString('hex')
  return fallback
}

/** The seed a hidden case is generated from: `h` + 20 hex digits of HMAC-SHA-256(secret, input). */
export function hiddenCaseSeed(input: string): string {
  return `h${createHmac('sha256', caseSecret()).update(`cyclodial/hidden-case|${input}`).digest('hex').slice(0, 20)}`
}
