// Assignment and Grade Services 2.0: an access token by the OAuth 2 client credentials
// grant with a signed JWT assertion (LTI Security Framework 1.0 §4.1; RFC 7523 §2.2),
// then a score posted to the line item's /scores endpoint (AGS 2.0 §3.4).
import { randomUUID } from 'node:crypto'
import { SignJWT } from 'jose'
import type { Kysely } from 'kysely'
import type { Database, LtiPlatformRow } from '~~/db/schema'
import { AGS_SCOPE, JWT_BEARER_ASSERTION, SCORE_MEDIA_TYPE } from './claims'
import { toolSigningKey } from './keys'

const tokens = new Map<string, { token: string, expiresAt: number }>()
const TIMEOUT_MS = 10_000

export class AgsError extends Error {}

async function clientAssertion(db: Kysely<Database>, platform: LtiPlatformRow): Promise<string> {
  const key = await toolSigningKey(db)
  return new SignJWT({})
    .setProtectedHeader({ alg: key.alg, kid: key.kid, typ: 'JWT' })
    .setIssuer(platform.client_id) // RFC 7523 §3 items 1 and 2: iss and sub are the client id
    .setSubject(platform.client_id)
    .setAudience(platform.token_url) // RFC 7523 §3 item 3: the token endpoint
    .setIssuedAt()
    .setExpirationTime('5m')
    .setJti(randomUUID()) // RFC 7523 §3 item 7
    .sign(key.key)
}

/** A bearer token for these scopes, reused until a minute before it expires. */
export async function accessToken(db: Kysely<Database>, platform: LtiPlatformRow, scopes: string[] = [AGS_SCOPE.score]): Promise<string> {
  const cacheKey = `${platform.id}|${platform.token_url}|${scopes.join(' ')}`
  const cached = tokens.get(cacheKey)
  if (cached && cached.expiresAt > Date.now() + 60_000) return cached.token
  const body = new URLSearchParams({
    grant_type: 'client_credentials', // RFC 6749 §4.4.2
    client_assertion_type: JWT_BEARER_ASSERTION,
    client_assertion: await clientAssertion(db, platform),
    scope: scopes.join(' '),
  })
  const res = await fetch(platform.token_url, {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded', 'accept': 'application/json' },
    body,
    signal: AbortSignal.timeout(TIMEOUT_MS),
  })
  const text = await res.text()
  if (!res.ok) throw new AgsError(`The platform's token endpoint answered ${res.status}: ${text.slice(0, 200)}`)
  let json: { access_token?: unknown, expires_in?: unknown }
  try {
    json = JSON.parse(text)
  }
  catch {
    throw new AgsError('The platform\'s token endpoint did not answer with JSON.')
  }
  if (typeof json.access_token !== 'string') throw new AgsError('The platform\'s token endpoint gave no access_token.')
  const seconds = typeof json.expires_in === 'number' && json.expires_in > 0 ? json.expires_in : 3600
  tokens.set(cacheKey, { token: json.access_token, expiresAt: Date.now() + seconds * 1000 })
  return json.access_token
}

/** The scores URL of a line item: its path with /scores appended, query kept (AGS 2.0 §3.4). */
export function scoresUrl(lineItem: string): string {
  const u = new URL(lineItem)
  u.pathname = `${u.pathname.replace(/\/+$/, '')}/scores`
  return u.href
}

export interface ScoreInput { userId: string, scoreGiven: number, scoreMaximum: number, comment?: string }

/** Posts one score (AGS 2.0 §3.4.1: activityProgress Completed, gradingProgress FullyGraded). */
export async function postScore(db: Kysely<Database>, platform: LtiPlatformRow, lineItem: string, score: ScoreInput): Promise<void> {
  const token = await accessToken(db, platform)
  const res = await fetch(scoresUrl(lineItem), {
    method: 'POST',
    headers: { 'content-type': SCORE_MEDIA_TYPE, 'authorization': `Bearer ${token}` },
    body: JSON.stringify({
      userId: score.userId,
      scoreGiven: score.scoreGiven,
      scoreMaximum: score.scoreMaximum,
      activityProgress: 'Completed',
      gradingProgress: 'FullyGraded',
      timestamp: new Date().toISOString(),
      ...(score.comment ? { comment: score.comment } : {}),
    }),
    signal: AbortSignal.timeout(TIMEOUT_MS),
  })
  if (res.status === 401) tokens.clear()
  if (!res.ok) throw new AgsError(`The platform answered ${res.status} to the score: ${(await res.text()).slice(0, 200)}`)
}
