// The launch: OIDC third-party initiated login (LTI Core 1.3 §4.1; OpenID Connect Core
// 1.0 §3.1.2.1 with the id_token response type and form_post response mode) and the
// checks on the id_token the platform posts back (LTI Security Framework 1.0 §5.1.3;
// OpenID Connect Core 1.0 §3.1.3.7; RFC 7519 §4.1).
import { randomBytes } from 'node:crypto'
import { decodeProtectedHeader, errors, jwtVerify, type JWTPayload } from 'jose'
import type { Kysely } from 'kysely'
import type { Database, LtiPlatformRow } from '~~/db/schema'
import { CLAIM, DEEP_LINKING_REQUEST, LTI_VERSION, RESOURCE_LINK_REQUEST, mapRoles, onlyAdministratorRoles, type MappedRole } from './claims'
import { LtiRefusal } from './html'
import { deploymentsOf, platformForLogin, platformKeySet } from './platforms'

/** A login's state and nonce live this long (common practice: a few minutes). */
export const STATE_SECONDS = 600
/** A verified launch must be finished by the same browser within this time. */
export const LAUNCH_SECONDS = 120
/** Clock skew allowed on exp/iat (common practice). */
export const CLOCK_TOLERANCE_SECONDS = 60
/** An id_token older than this (by iat) is refused (OpenID Connect Core 1.0 §3.1.3.7 item 10 leaves the window to the client; common practice). */
export const MAX_TOKEN_AGE_SECONDS = 600

export const STATE_COOKIE_PREFIX = 'cyclodial_lti_'

export interface LoginParams {
  iss?: string
  login_hint?: string
  target_link_uri?: string
  lti_message_hint?: string
  client_id?: string
  lti_deployment_id?: string
}

function randomToken(): string {
  return randomBytes(24).toString('base64url')
}

function after(seconds: number, now = new Date()): string {
  return new Date(now.getTime() + seconds * 1000).toISOString()
}

/** Finds the platform and checks the login request; the refusal names the field at fault. */
export async function checkLogin(db: Kysely<Database>, params: LoginParams, siteOrigin: string): Promise<{ platform: LtiPlatformRow, target: string }> {
  for (const field of ['iss', 'login_hint', 'target_link_uri'] as const) {
    const value = params[field]
    if (typeof value !== 'string' || !value.trim() || value.length > 2000) {
      throw new LtiRefusal(400, 'missing-parameter', `The login request needs ${field} (LTI Core 1.3 §4.1).`, field)
    }
  }
  const platforms = await platformForLogin(db, params.iss!, params.client_id || undefined)
  if (!platforms.length) throw new LtiRefusal(400, 'unknown-platform', `No active learning platform is registered with the issuer ${params.iss}${params.client_id ? ` and client id ${params.client_id}` : ''}.`, 'iss')
  if (platforms.length > 1) throw new LtiRefusal(400, 'client-id-required', 'Several platforms share this issuer: the login request must name client_id.', 'client_id')
  const platform = platforms[0]!
  if (params.lti_deployment_id && !deploymentsOf(platform).includes(params.lti_deployment_id)) {
    throw new LtiRefusal(403, 'unknown-deployment', `The deployment ${params.lti_deployment_id} is not registered for ${platform.name}.`, 'lti_deployment_id')
  }
  let target: URL
  try {
    target = new URL(params.target_link_uri!)
  }
  catch {
    throw new LtiRefusal(400, 'bad-target', 'target_link_uri is not a URL.', 'target_link_uri')
  }
  if (target.origin !== new URL(siteOrigin).origin) throw new LtiRefusal(400, 'bad-target', `target_link_uri must be an address on ${new URL(siteOrigin).origin}.`, 'target_link_uri')
  return { platform, target: target.href }
}

/** Stores a fresh state and nonce and gives the authentication request URL. */
export async function startLogin(db: Kysely<Database>, platform: LtiPlatformRow, params: LoginParams, target: string, redirectUri: string): Promise<{ state: string, nonce: string, url: string }> {
  const state = randomToken()
  const nonce = randomToken()
  const now = new Date()
  await db.insertInto('lti_states').values({
    state, nonce, platform_id: platform.id, target_link_uri: target, expires_at: after(STATE_SECONDS, now), used_at: null, created_at: now.toISOString(),
  }).execute()
  // clear out what can no longer be used
  await db.deleteFrom('lti_states').where('expires_at', '<', now.toISOString()).execute()
  const url = new URL(platform.auth_url)
  const query: Record<string, string> = {
    scope: 'openid', // OpenID Connect Core 1.0 §3.1.2.1
    response_type: 'id_token', // LTI Core 1.3 §4.1.1 (implicit flow)
    response_mode: 'form_post', // LTI Security Framework 1.0 §5.1.1.2
    prompt: 'none', // LTI Security Framework 1.0 §5.1.1.2
    client_id: platform.client_id,
    redirect_uri: redirectUri,
    login_hint: params.login_hint!,
    state,
    nonce,
  }
  if (params.lti_message_hint) query.lti_message_hint = params.lti_message_hint
  for (const [k, v] of Object.entries(query)) url.searchParams.set(k, v)
  return { state, nonce, url: url.href }
}

export interface VerifiedLaunch {
  platform: LtiPlatformRow
  state: string
  targetLinkUri: string
  claims: JWTPayload & Record<string, unknown>
  messageType: typeof RESOURCE_LINK_REQUEST | typeof DEEP_LINKING_REQUEST
  deploymentId: string
  role: MappedRole
}

function mapJoseError(error: unknown): LtiRefusal {
  if (error instanceof errors.JWKSNoMatchingKey) return new LtiRefusal(401, 'unknown-kid', 'The id_token was signed with a key the platform does not publish (unknown kid).', 'id_token')
  if (error instanceof errors.JWKSMultipleMatchingKeys) return new LtiRefusal(401, 'ambiguous-kid', 'The platform publishes several keys that match the id_token\'s header.', 'id_token')
  if (error instanceof errors.JWSSignatureVerificationFailed) return new LtiRefusal(401, 'bad-signature', 'The id_token\'s signature does not verify against the platform\'s key set.', 'id_token')
  if (error instanceof errors.JWTExpired) return new LtiRefusal(401, 'expired', 'The id_token has expired (exp is in the past).', 'id_token')
  if (error instanceof errors.JWTClaimValidationFailed) {
    const claim = error.claim
    if (claim === 'aud') return new LtiRefusal(401, 'wrong-audience', 'The id_token is not addressed to Cyclodial (aud does not hold this platform\'s client id).', 'id_token')
    if (claim === 'iss') return new LtiRefusal(401, 'wrong-issuer', 'The id_token was issued by another platform (iss).', 'id_token')
    if (claim === 'iat') return new LtiRefusal(401, 'bad-iat', 'The id_token\'s issue time (iat) is missing, in the future or too old.', 'id_token')
    if (claim === 'exp') return new LtiRefusal(401, 'expired', 'The id_token has no valid expiry (exp).', 'id_token')
    return new LtiRefusal(401, 'bad-claim', `The id_token's ${claim} claim is not valid.`, 'id_token')
  }
  if (error instanceof errors.JOSEAlgNotAllowed) return new LtiRefusal(401, 'bad-algorithm', 'The id_token must be signed with RS256.', 'id_token')
  if (error instanceof errors.JWKSTimeout || error instanceof errors.JWKSInvalid) return new LtiRefusal(401, 'platform-keys-unavailable', 'The platform\'s key set could not be read; try again shortly.', 'id_token')
  if (error instanceof errors.JOSEError) return new LtiRefusal(400, 'bad-token', 'The id_token is not a well-formed signed JWT.', 'id_token')
  return new LtiRefusal(401, 'platform-keys-unavailable', 'The platform\'s key set could not be read; try again shortly.', 'id_token')
}

/**
 * Every check of a launch, each refusing on its own fault: the state (single use,
 * not expired), the signature against the platform's key set, iss, aud/azp, exp/iat,
 * the nonce (bound to this login, single use), the deployment, the version and message
 * type, and the roles.
 */
export async function verifyLaunch(db: Kysely<Database>, form: { id_token?: string, state?: string }): Promise<VerifiedLaunch> {
  if (typeof form.id_token !== 'string' || !form.id_token) throw new LtiRefusal(400, 'missing-parameter', 'The launch needs id_token (OpenID Connect Core 1.0 §3.2.2.5).', 'id_token')
  if (typeof form.state !== 'string' || !form.state) throw new LtiRefusal(400, 'missing-parameter', 'The launch needs state.', 'state')
  const now = new Date()
  const stateRow = await db.selectFrom('lti_states').selectAll().where('state', '=', form.state).executeTakeFirst()
  if (!stateRow || stateRow.expires_at < now.toISOString()) throw new LtiRefusal(400, 'unknown-state', 'This launch was not started here or took too long (unknown or expired state). Open the link in your course again.', 'state')
  // single use: the first request to claim it wins
  const claimed = await db.updateTable('lti_states').set({ used_at: now.toISOString() }).where('state', '=', form.state).where('used_at', 'is', null).executeTakeFirst()
  if (Number(claimed.numUpdatedRows) !== 1) throw new LtiRefusal(400, 'state-used', 'This launch was already used. Open the link in your course again.', 'state')
  const platform = await db.selectFrom('lti_platforms').selectAll().where('id', '=', stateRow.platform_id).executeTakeFirst()
  if (!platform || platform.disabled) throw new LtiRefusal(403, 'platform-disabled', 'This learning platform is not active in Cyclodial.', 'state')

  try {
    decodeProtectedHeader(form.id_token)
  }
  catch {
    throw new LtiRefusal(400, 'bad-token', 'The id_token is not a well-formed signed JWT.', 'id_token')
  }
  let payload: JWTPayload & Record<string, unknown>
  try {
    const verified = await jwtVerify(form.id_token, platformKeySet(platform.jwks_url), {
      issuer: platform.issuer, // OpenID Connect Core 1.0 §3.1.3.7 item 2
      audience: platform.client_id, // item 3
      algorithms: ['RS256'], // item 6 and LTI Security Framework 1.0 §5.1.3 item 6
      clockTolerance: CLOCK_TOLERANCE_SECONDS, // items 9 and 10
      maxTokenAge: MAX_TOKEN_AGE_SECONDS,
      requiredClaims: ['exp', 'iat', 'sub', 'nonce'],
    })
    payload = verified.payload as typeof payload
  }
  catch (error) {
    throw mapJoseError(error)
  }
  // OpenID Connect Core 1.0 §3.1.3.7 items 4 and 5: several audiences need azp = our client id; azp, when present, must be it
  const aud = Array.isArray(payload.aud) ? payload.aud : [payload.aud]
  if ((aud.length > 1 && payload.azp === undefined) || (payload.azp !== undefined && payload.azp !== platform.client_id)) {
    throw new LtiRefusal(401, 'wrong-audience', 'The id_token names several audiences without Cyclodial as its authorised party (azp).', 'id_token')
  }
  const nonce = String(payload.nonce)
  const used = await db.selectFrom('lti_nonces').select('nonce').where('platform_id', '=', platform.id).where('nonce', '=', nonce).executeTakeFirst()
  if (used) throw new LtiRefusal(401, 'replayed-nonce', 'This id_token\'s nonce was already used: a launch cannot be replayed.', 'id_token')
  if (nonce !== stateRow.nonce) throw new LtiRefusal(401, 'nonce-mismatch', 'The id_token\'s nonce does not belong to this login.', 'id_token')
  try {
    await db.insertInto('lti_nonces').values({ platform_id: platform.id, nonce, expires_at: new Date(now.getTime() + (MAX_TOKEN_AGE_SECONDS + CLOCK_TOLERANCE_SECONDS) * 1000).toISOString() }).execute()
  }
  catch {
    throw new LtiRefusal(401, 'replayed-nonce', 'This id_token\'s nonce was already used: a launch cannot be replayed.', 'id_token')
  }
  await db.deleteFrom('lti_nonces').where('expires_at', '<', now.toISOString()).execute()

  const deploymentId = payload[CLAIM.deploymentId]
  if (typeof deploymentId !== 'string' || !deploymentsOf(platform).includes(deploymentId)) {
    throw new LtiRefusal(403, 'unknown-deployment', `The deployment ${typeof deploymentId === 'string' ? deploymentId : '(none)'} is not registered for ${platform.name} (LTI Core 1.3 §5.3.3).`, 'id_token')
  }
  if (payload[CLAIM.version] !== LTI_VERSION) throw new LtiRefusal(400, 'wrong-version', `Cyclodial takes LTI version ${LTI_VERSION} launches (LTI Core 1.3 §5.3.2).`, 'id_token')
  const messageType = payload[CLAIM.messageType]
  if (messageType !== RESOURCE_LINK_REQUEST && messageType !== DEEP_LINKING_REQUEST) {
    throw new LtiRefusal(400, 'wrong-message-type', `Cyclodial takes ${RESOURCE_LINK_REQUEST} and ${DEEP_LINKING_REQUEST} messages, not ${typeof messageType === 'string' ? messageType : '(none)'}.`, 'id_token')
  }
  if (messageType === RESOURCE_LINK_REQUEST) {
    const link = payload[CLAIM.resourceLink] as { id?: unknown } | undefined
    if (!link || typeof link.id !== 'string' || !link.id) throw new LtiRefusal(400, 'missing-resource-link', 'A resource link launch must carry the resource link id (LTI Core 1.3 §5.3.5).', 'id_token')
  }
  else {
    const settings = payload[CLAIM.deepLinkingSettings] as { deep_link_return_url?: unknown } | undefined
    if (!settings || typeof settings.deep_link_return_url !== 'string') throw new LtiRefusal(400, 'missing-deep-linking-settings', 'A deep linking request must carry deep_link_return_url (Deep Linking 2.0 §4.4.1).', 'id_token')
    try {
      const u = new URL(settings.deep_link_return_url)
      if (u.protocol !== 'https:' && u.protocol !== 'http:') throw new Error('scheme')
    }
    catch {
      throw new LtiRefusal(400, 'missing-deep-linking-settings', 'deep_link_return_url is not an http(s) address.', 'id_token')
    }
  }
  const roles = payload[CLAIM.roles]
  if (!Array.isArray(roles) || roles.some(r => typeof r !== 'string')) throw new LtiRefusal(400, 'missing-roles', 'The id_token carries no roles claim (LTI Core 1.3 §5.3.7).', 'id_token')
  const role = mapRoles(roles as string[])
  if (!role) {
    throw new LtiRefusal(403, 'no-usable-role', onlyAdministratorRoles(roles as string[])
      ? 'Platform administrators are not signed in to Cyclodial: launch as an instructor or a learner of the course.'
      : 'Cyclodial signs in learners and instructors only, and this launch named neither.', 'id_token')
  }
  if (typeof payload.sub !== 'string' || !payload.sub) throw new LtiRefusal(400, 'missing-subject', 'The id_token has no subject (sub): anonymous launches are not taken.', 'id_token')
  return { platform, state: stateRow.state, targetLinkUri: stateRow.target_link_uri, claims: payload, messageType, deploymentId, role }
}

/** Keeps the verified launch for the browser that started it. */
export async function storeLaunch(db: Kysely<Database>, launch: VerifiedLaunch): Promise<string> {
  const id = randomToken()
  const now = new Date()
  await db.insertInto('lti_launches').values({
    id,
    state: launch.state,
    platform_id: launch.platform.id,
    user_id: null,
    message_type: launch.messageType,
    claims_json: JSON.stringify({ ...launch.claims, 'cyclodial:role': launch.role, 'cyclodial:target': launch.targetLinkUri }),
    expires_at: after(LAUNCH_SECONDS, now),
    finished_at: null,
    created_at: now.toISOString(),
  }).execute()
  await db.deleteFrom('lti_launches').where('expires_at', '<', new Date(now.getTime() - 86_400_000).toISOString()).execute()
  return id
}
