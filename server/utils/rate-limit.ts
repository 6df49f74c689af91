// Sign-in throttling. Attempts are stored in SQLite so a restart does not reset
// them. Each attempt is reserved (counted) atomically BEFORE the password is
// checked, so a burst of simultaneous tries cannot all slip past the count.
// Five failures for one e-mail from one address within 15 minutes block the
// sixth try (429). Failures from one address across many e-mails only SLOW that
// address down (a growing delay before the check), never block it: one address
// may be a whole school behind one router, and must not be able to lock others
// out of accounts it has not itself attacked.
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'

export const LOGIN_WINDOW_MINUTES = 15
export const MAX_FAILURES_PER_EMAIL_AND_IP = 5
/** Failures from one address (any e-mails) before its sign-ins are slowed down. */
export const SLOW_AFTER_FAILURES_PER_IP = 10
export const SLOWDOWN_STEP_MS = 200
export const MAX_SLOWDOWN_MS = 2000

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

/** Delay before checking a password from an address with `failures` recent failures. */
export function slowdownMs(failures: number): number {
  if (failures < SLOW_AFTER_FAILURES_PER_IP) return 0
  return Math.min(MAX_SLOWDOWN_MS, SLOWDOWN_STEP_MS * (failures - SLOW_AFTER_FAILURES_PER_IP + 1))
}

// Attempts reserved but not yet decided, per address (this process). They count
// towards the per-e-mail limit (that is what stops a burst) but not towards the
// address's slow-down, which is about failures: a class signing in at once from
// one school network is not slowed by its own successful sign-ins.
const pendingByIp = new Map<string, number>()

/** Call once the reserved attempt is decided (success or failure). */
export function settleLoginAttempt(ip: string): void {
  const n = (pendingByIp.get(ip) ?? 1) - 1
  if (n > 0) pendingByIp.set(ip, n)
  else pendingByIp.delete(ip)
}

export type Reservation = Throttle & { attemptId: number | null, delayMs: number }

/**
 * Counts and reserves one sign-in attempt in a single transaction (SQLite runs
 * it alone), before the slow password check. The reservation counts as a
 * failure until clearLoginFailures removes it after a correct password; the
 * caller settles it with settleLoginAttempt either way.
 */
export async function reserveLoginAttempt(db: Kysely<Database>, email: string, ip: string, now = new Date()): Promise<Reservation> {
  const since = new Date(now.getTime() - LOGIN_WINDOW_MINUTES * 60_000).toISOString()
  return db.transaction().execute(async (trx) => {
    const pair = await trx.selectFrom('login_failures').select('created_at')
      .where('email', '=', email).where('ip', '=', ip).where('created_at', '>', since).execute()
    const blocked = throttleFrom(pair.map(r => Date.parse(r.created_at)), MAX_FAILURES_PER_EMAIL_AND_IP, now.getTime())
    if (blocked.limited) return { ...blocked, attemptId: null, delayMs: 0 }
    const { n } = await trx.selectFrom('login_failures').select(eb => eb.fn.countAll<number>().as('n'))
      .where('ip', '=', ip).where('created_at', '>', since).executeTakeFirstOrThrow()
    const failures = Math.max(0, Number(n) - (pendingByIp.get(ip) ?? 0))
    const row = await trx.insertInto('login_failures').values({ email, ip, created_at: now.toISOString() }).returning('id').executeTakeFirstOrThrow()
    // Keep the table small: nothing older than a day matters.
    await trx.deleteFrom('login_failures').where('created_at', '<', new Date(now.getTime() - 86_400_000).toISOString()).execute()
    pendingByIp.set(ip, (pendingByIp.get(ip) ?? 0) + 1)
    return { limited: false, retryAfterSeconds: 0, attemptId: row.id, delayMs: slowdownMs(failures) }
  })
}

/** After a correct password: this e-mail's failures from this address (and the reservation) are forgotten. */
export async function clearLoginFailures(db: Kysely<Database>, email: string, ip: string): Promise<void> {
  await db.deleteFrom('login_failures').where('email', '=', email).where('ip', '=', ip).execute()
}
