// Sign-in throttling. Attempts are stored in the database (login_failures), so
// neither a restart nor a second instance behind the load balancer resets or
// splits them: every count below is read from the shared table. Each attempt is reserved (counted) atomically BEFORE the password is
// checked, so a burst of simultaneous tries cannot all slip past the count.
// Five failures for one e-mail from one address within 15 minutes block the
// sixth try (429). Failures from one address across many e-mails only SLOW that
// address down (a growing delay before the check), never block it: one address
// may be a whole school behind one router, and must not be able to lock others
// out of accounts it has not itself attacked.
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'
import { lockForTransaction } from '~~/db/dialect'

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

// Attempts reserved but not yet decided are rows with pending = 1. They count
// towards the per-e-mail limit (that is what stops a burst) but not towards the
// address's slow-down, which is about failures: a class signing in at once from
// one school network is not slowed by its own successful sign-ins. Being rows, not
// process memory, they count the same whichever instance took them.

/** Call once the reserved attempt is decided (success or failure): it stops being pending. */
export async function settleLoginAttempt(db: Kysely<Database>, attemptId: number | null): Promise<void> {
  if (attemptId === null) return
  await db.updateTable('login_failures').set({ pending: 0 }).where('id', '=', attemptId).execute()
}

export type Reservation = Throttle & { attemptId: number | null, delayMs: number }

/**
 * Counts and reserves one sign-in attempt in a single transaction, before the
 * slow password check. SQLite runs the transaction alone; on PostgreSQL it first
 * takes a transaction lock on the e-mail and address (lockForTransaction), so
 * simultaneous tries through any number of instances are counted one after the
 * other. The reservation counts as a failure until clearLoginFailures removes it
 * after a correct password; the caller settles it with settleLoginAttempt either way.
 */
export async function reserveLoginAttempt(db: Kysely<Database>, email: string, ip: string, now = new Date()): Promise<Reservation> {
  const since = new Date(now.getTime() - LOGIN_WINDOW_MINUTES * 60_000).toISOString()
  return db.transaction().execute(async (trx) => {
    await lockForTransaction(trx, `sign-in ${email} ${ip}`)
    const pair = await trx.selectFrom('login_failures').select('created_at')
      .where('email', '=', email).where('ip', '=', ip).where('created_at', '>', since).execute()
    const blocked = throttleFrom(pair.map(r => Date.parse(r.created_at)), MAX_FAILURES_PER_EMAIL_AND_IP, now.getTime())
    if (blocked.limited) return { ...blocked, attemptId: null, delayMs: 0 }
    const { n } = await trx.selectFrom('login_failures').select(eb => eb.fn.countAll<number>().as('n'))
      .where('ip', '=', ip).where('created_at', '>', since).where('pending', '=', 0).executeTakeFirstOrThrow()
    const failures = Number(n)
    const row = await trx.insertInto('login_failures').values({ email, ip, created_at: now.toISOString(), pending: 1 }).returning('id').executeTakeFirstOrThrow()
    // Keep the table small: nothing older than a day matters.
    await trx.deleteFrom('login_failures').where('created_at', '<', new Date(now.getTime() - 86_400_000).toISOString()).execute()
    return { limited: false, retryAfterSeconds: 0, attemptId: row.id, delayMs: slowdownMs(failures) }
  })
}

/** After a correct password: this e-mail's failures from this address (and the reservation) are forgotten. */
export async function clearLoginFailures(db: Kysely<Database>, email: string, ip: string): Promise<void> {
  await db.deleteFrom('login_failures').where('email', '=', email).where('ip', '=', ip).execute()
}
