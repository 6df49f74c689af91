// Revocable sessions on top of nuxt-auth-utils. The sealed cookie carries a
// random session id (in the session's `secure` part, which the module never
// sends to the browser); the `sessions` table says whether that session still
// stands. Sign-out revokes it; a password reset, a disabled account and a role
// change revoke all of a person's sessions; an idle timeout and an absolute
// lifetime end it.
//
// Cheap: unsealing the cookie (PBKDF2-derived keys) costs about half a
// millisecond of CPU, so the unsealed payload is cached per cookie value in a
// bounded LRU; what can change (revocation, expiry, role, disabled) is read on
// every request with one indexed read (sessions joined to users by primary key),
// so every instance sees a revocation at once: only the unsealing is cached.
import { randomBytes, randomUUID } from 'node:crypto'
import type { H3Event } from 'h3'
import { unsealSession } from 'h3'
import { LRUCache } from 'lru-cache'
import type { Kysely, Transaction } from 'kysely'
import type { Database } from '~~/db/schema'
import { sqliteHandles } from '~~/db/open'
import type { SessionUserData } from '#shared/auth/roles'

/** Defaults: 12 hours idle, 14 days at most (OWASP ASVS 4.0 V3.3.1/V3.3.2 ask for both; the values are common practice). */
export const DEFAULT_IDLE_SECONDS = 12 * 3600
export const DEFAULT_MAX_AGE_SECONDS = 14 * 24 * 3600
/** last_seen_at is written at most this often per session (or a tenth of the idle timeout, if shorter). */
export const TOUCH_SECONDS = 60
/** Cached unsealed cookies live at most this long (or a quarter of the idle timeout, if shorter). */
export const CACHE_TTL_SECONDS = 5 * 60
export const CACHE_MAX_ENTRIES = 10_000

interface H3SessionShape { id: string, createdAt: number, data: Record<string, any> }
type AuthDb = Kysely<Database> | Transaction<Database>

export interface SessionSettings { name: string, idleSeconds: number, maxAgeSeconds: number, config: Record<string, any> }

let settings: SessionSettings | undefined
export function sessionSettings(): SessionSettings {
  if (settings) return settings
  const runtime = useRuntimeConfig()
  const session = (runtime.session ?? {}) as Record<string, any>
  const maxAgeSeconds = positive(session.maxAge, DEFAULT_MAX_AGE_SECONDS)
  // the same settings nuxt-auth-utils gives h3, so unsealing here matches it
  const config = { ...session, password: process.env.NUXT_SESSION_PASSWORD || session.password, maxAge: maxAgeSeconds }
  settings = {
    name: String(session.name || 'nuxt-session'),
    idleSeconds: positive((runtime as Record<string, any>).sessionIdleSeconds, DEFAULT_IDLE_SECONDS),
    maxAgeSeconds,
    config,
  }
  return settings
}

function positive(value: unknown, fallback: number): number {
  const n = Number(value)
  return Number.isFinite(n) && n > 0 ? n : fallback
}

const INVALID = Symbol('invalid cookie')
let cache: LRUCache<string, H3SessionShape | typeof INVALID> | undefined
function unsealedCache() {
  if (!cache) {
    const { idleSeconds } = sessionSettings()
    cache = new LRUCache({ max: CACHE_MAX_ENTRIES, ttl: 1000 * Math.min(CACHE_TTL_SECONDS, idleSeconds / 4) })
  }
  return cache
}

function sealedValue(event: H3Event, name: string): string | undefined {
  // h3 reads a session header before the cookie; do the same.
  const header = event.node.req.headers[`x-${name.toLowerCase()}-session`]
  if (typeof header === 'string' && header) return header
  return parseCookies(event)[name] || undefined
}

interface SessionRow { last_seen_at: string, expires_at: string, revoked_at: string | null, id: number, email: string, name: string, role: SessionUserData['role'], disabled: number }

const SESSION_SQL = `select s.last_seen_at, s.expires_at, s.revoked_at, u.id, u.email, u.name, u.role, u.disabled
  from sessions s join users u on u.id = s.user_id where s.id = ?`
let statement: { db: Kysely<Database>, get: (sid: string) => SessionRow | undefined } | undefined

/**
 * The session and its user in one indexed read (both by primary key). It runs on
 * every signed-in request, so on SQLite it is one prepared statement on the file's
 * handle rather than a query Kysely compiles each time. (It shares Kysely's one
 * connection, so inside another request's open transaction it may see that
 * transaction's revocations a moment early; never a session that was not there.)
 * On PostgreSQL it is the same read through the pool. Either way it is read from
 * the database on every request, never cached in the process, so a sign-out or a
 * revocation made through one instance ends the session on every instance at once.
 */
async function sessionRow(db: Kysely<Database>, sid: string): Promise<SessionRow | undefined> {
  const raw = sqliteHandles.get(db)
  if (!raw) {
    return db.selectFrom('sessions as s').innerJoin('users as u', 'u.id', 's.user_id')
      .select(['s.last_seen_at', 's.expires_at', 's.revoked_at', 'u.id', 'u.email', 'u.name', 'u.role', 'u.disabled'])
      .where('s.id', '=', sid).executeTakeFirst() as Promise<SessionRow | undefined>
  }
  if (statement?.db !== db) {
    const prepared = raw.prepare(SESSION_SQL)
    statement = { db, get: (id: string) => prepared.get(id) as SessionRow | undefined }
  }
  return statement.get(sid)
}

export interface ResolvedSession { sid: string, user: SessionUserData }

/**
 * Who this request is signed in as, or null. Memoised on the event; run first by
 * server/middleware/0.session.ts so every route, including the module's own
 * /api/_auth/session, sees a revoked or expired session as signed out.
 */
export async function resolveSession(event: H3Event): Promise<ResolvedSession | null> {
  const ctx = event.context as { authSession?: Promise<ResolvedSession | null> }
  ctx.authSession ??= resolve(event)
  return ctx.authSession
}

async function resolve(event: H3Event): Promise<ResolvedSession | null> {
  const s = sessionSettings()
  const sealed = sealedValue(event, s.name)
  if (!sealed) return null
  const lru = unsealedCache()
  let entry = lru.get(sealed)
  if (entry === undefined) {
    try {
      entry = await unsealSession(event, s.config as any, sealed) as H3SessionShape
    }
    catch {
      entry = INVALID
    }
    lru.set(sealed, entry)
  }
  const sid = entry === INVALID ? undefined : entry.data?.secure?.sid
  let resolved: ResolvedSession | null = null
  if (entry !== INVALID && typeof sid === 'string') {
    const db = await useDb()
    const row = await sessionRow(db, sid)
    const now = Date.now()
    if (row && !row.revoked_at && !row.disabled
      && Date.parse(row.expires_at) > now
      && now - Date.parse(row.last_seen_at) < s.idleSeconds * 1000) {
      resolved = { sid, user: { id: row.id, email: row.email, name: row.name, role: row.role } }
      if (now - Date.parse(row.last_seen_at) >= 1000 * Math.min(TOUCH_SECONDS, s.idleSeconds / 10)) {
        await db.updateTable('sessions').set({ last_seen_at: new Date(now).toISOString() }).where('id', '=', sid).execute()
      }
    }
  }

  event.context.sessions ??= Object.create(null)
  if (resolved && entry !== INVALID) {
    // Hand h3 the unsealed session so nuxt-auth-utils never unseals it again. A
    // copy: h3 assigns into `data` when a route updates the session (top level only).
    event.context.sessions![s.name] = { id: entry.id, createdAt: entry.createdAt, data: { ...entry.data } }
  }
  else if (entry !== INVALID && !entry.data?.user && !sid) {
    // an anonymous session (the module makes one for visitors): keep it as it is
    event.context.sessions![s.name] = { id: entry.id, createdAt: entry.createdAt, data: Object.create(null) }
  }
  else {
    // Signed out: revoked, expired, idle, disabled, unreadable or from before
    // sessions were revocable. An empty session (no fresh cookie is sealed for
    // it), and the browser's copy is expired.
    event.context.sessions![s.name] = { id: '', createdAt: 0, data: Object.create(null) }
    deleteCookie(event, s.name, { ...(s.config.cookie ?? {}), path: '/' })
  }
  return resolved
}

/** Opens a session for `user` and seals its id into the cookie (sign-in, invitation acceptance). */
export async function startSession(event: H3Event, user: SessionUserData): Promise<void> {
  const s = sessionSettings()
  const db = await useDb()
  const previous = await resolveSession(event)
  const now = new Date()
  const sid = randomBytes(24).toString('base64url')
  await db.transaction().execute(async (trx) => {
    // a sign-in over an existing session replaces it
    if (previous) await trx.updateTable('sessions').set({ revoked_at: now.toISOString() }).where('id', '=', previous.sid).where('revoked_at', 'is', null).execute()
    await trx.insertInto('sessions').values({
      id: sid,
      user_id: user.id,
      created_at: now.toISOString(),
      last_seen_at: now.toISOString(),
      expires_at: new Date(now.getTime() + s.maxAgeSeconds * 1000).toISOString(),
      revoked_at: null,
    }).execute()
    // keep the table small: sessions that ended a day ago matter to nobody
    const dayAgo = new Date(now.getTime() - 86_400_000).toISOString()
    await trx.deleteFrom('sessions').where(eb => eb.or([eb('expires_at', '<', dayAgo), eb('revoked_at', '<', dayAgo)])).execute()
  })
  // A fresh h3 session (new id and creation time), not the one the request
  // came with, so nothing of a previous session carries over.
  event.context.sessions ??= Object.create(null)
  event.context.sessions![s.name] = { id: randomUUID(), createdAt: now.getTime(), data: Object.create(null) }
  await setUserSession(event, { user, loggedInAt: now.toISOString(), secure: { sid } } as any)
  ;(event.context as { authSession?: Promise<ResolvedSession | null> }).authSession = Promise.resolve({ sid, user })
}

/** Ends this request's session (sign-out). */
export async function endSession(event: H3Event): Promise<void> {
  const current = await resolveSession(event)
  if (current) {
    const db = await useDb()
    await db.updateTable('sessions').set({ revoked_at: nowIso() }).where('id', '=', current.sid).where('revoked_at', 'is', null).execute()
  }
  await clearUserSession(event)
  ;(event.context as { authSession?: Promise<ResolvedSession | null> }).authSession = Promise.resolve(null)
}

/** Ends every session of one person (password reset or change, disabled account, role change, sign out everywhere). */
export async function revokeUserSessions(db: AuthDb, userId: number, now: string = nowIso()): Promise<number> {
  const result = await db.updateTable('sessions').set({ revoked_at: now })
    .where('user_id', '=', userId).where('revoked_at', 'is', null).executeTakeFirst()
  return Number(result.numUpdatedRows)
}
