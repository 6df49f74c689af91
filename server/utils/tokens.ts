// Single-use links (invitations, password resets): the raw token goes in the
// e-mail, only its SHA-256 is stored, so a leaked database cannot be replayed.
import { createHash, randomBytes } from 'node:crypto'

export const INVITATION_TTL_MINUTES = 7 * 24 * 60
export const RESET_TTL_MINUTES = 60

export function newToken(): { token: string, hash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashToken(token) }
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

export type TokenState = 'usable' | 'expired' | 'used'

export function tokenState(record: { expires_at: string, used_at: string | null }, now: Date = new Date()): TokenState {
  if (record.used_at) return 'used'
  if (Date.parse(record.expires_at) <= now.getTime()) return 'expired'
  return 'usable'
}
