// Sign-in throttling. Failures are stored in SQLite so a restart does not reset
// them. Five failures for one e-mail from one address within 15 minutes block
// the sixth try (429); a single address is also capped across all e-mails.
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'

export const LOGIN_WINDOW_MINUTES = 15
export const MAX_FAILURES_PER_EMAIL_AND_IP = 5
export const MAX_FAILURES_PER_IP = 30

export interface Throttle { limited: boolean, retryAfterSeconds: number }

/** Pure rule: given failure times (ms) in the window, is the next try allowed? */
export function throttleFrom(failureTimes: number[], max: number, now: number, windowMinutes = LOGIN_WINDOW_MINUTES): Throttle {
  const windowMs = windowMinutes * 60_000
  const recent = failureTimes.filter(t => now - t < windowMs).sort((a, b) => a - b)
  if (recent.length < max) return { limited: false, retryAfterSeconds: 0 }
  // The block lifts when the oldest failure that still counts leaves the window.
  const oldestCounting = recent[recent.length - max]!
  return { limited: true, retryAfterSeconds: Math.max(1, Math.ceil((oldestCounting + windowMs - now) / 1000)) }
}

export async function loginThrottle(db: Kysely<Database>, email: string, ip: string, now = new Date()): Promise<Throttle> {
  const since = new Date(now.getTime() - LOGIN_WINDOW_MINUTES * 60_000).toISOString()
  const [pair, address] = await Promise.all([
    db.selectFrom('login_failures').select('created_at')
      .where('email', '=', email).where('ip', '=', ip).where('created_at', '>', since).execute(),
    db.selectFrom('login_failures').select('created_at')
      .where('ip', '=', ip).where('created_at', '>', since).execute(),
  ])
  const a = throttleFrom(pair.map(r => Date.parse(r.created_at)), MAX_FAILURES_PER_EMAIL_AND_IP, now.getTime())
  const b = throttleFrom(address.map(r => Date.parse(r.created_at)), MAX_FAILURES_PER_IP, now.getTime())
  return a.limited || b.limited
    ? { limited: true, retryAfterSeconds: Math.max(a.retryAfterSeconds, b.retryAfterSeconds) }
    : { limited: false, retryAfterSeconds: 0 }
}

export async function recordLoginFailure(db: Kysely<Database>, email: string, ip: string, now = new Date()): Promise<void> {
  await db.insertInto('login_failures').values({ email, ip, created_at: now.toISOString() }).execute()
  // Keep the table small: nothing older than a day matters.
  await db.deleteFrom('login_failures').where('created_at', '<', new Date(now.getTime() - 86_400_000).toISOString()).execute()
}

export async function clearLoginFailures(db: Kysely<Database>, email: string, ip: string): Promise<void> {
  await db.deleteFrom('login_failures').where('email', '=', email).where('ip', '=', ip).execute()
}
