// Registered learning platforms: reading rows, the view administrators see, and
// each platform's key set (jose's remote JWKS: cached, refetched on an unknown kid,
// so a platform's key rotation is picked up; RFC 7517 §5).
import { createRemoteJWKSet } from 'jose'
import type { Kysely } from 'kysely'
import type { Database, LtiPlatformRow } from '~~/db/schema'
import type { PlatformView, ToolConfiguration } from '#shared/types/lti'
import { AGS_SCOPE } from './claims'

export function deploymentsOf(row: Pick<LtiPlatformRow, 'deployment_ids'>): string[] {
  try {
    const list = JSON.parse(row.deployment_ids) as unknown
    return Array.isArray(list) ? list.filter((d): d is string => typeof d === 'string') : []
  }
  catch {
    return []
  }
}

export function platformView(row: LtiPlatformRow): PlatformView {
  return {
    id: row.id,
    name: row.name,
    issuer: row.issuer,
    clientId: row.client_id,
    deploymentIds: deploymentsOf(row),
    authUrl: row.auth_url,
    tokenUrl: row.token_url,
    jwksUrl: row.jwks_url,
    disabled: row.disabled === 1,
    createdAt: row.created_at,
    updatedAt: row.updated_at,
  }
}

/** The platform a login names: by issuer, and by client id when several share an issuer. */
export async function platformForLogin(db: Kysely<Database>, issuer: string, clientId?: string): Promise<LtiPlatformRow[]> {
  let q = db.selectFrom('lti_platforms').selectAll().where('issuer', '=', issuer).where('disabled', '=', 0)
  if (clientId) q = q.where('client_id', '=', clientId)
  return q.execute()
}

const keySets = new Map<string, ReturnType<typeof createRemoteJWKSet>>()

/** The platform's key set, cached per URL (jose refetches at most every 5 s on an unknown kid). */
export function platformKeySet(jwksUrl: string) {
  let set = keySets.get(jwksUrl)
  if (!set) {
    set = createRemoteJWKSet(new URL(jwksUrl), { cooldownDuration: 5_000, cacheMaxAge: 10 * 60_000, timeoutDuration: 5000 })
    keySets.set(jwksUrl, set)
  }
  return set
}

/** What an administrator copies into the platform when registering Cyclodial. */
export function toolConfiguration(siteOrigin: string): ToolConfiguration {
  return {
    title: 'Cyclodial',
    description: 'Practise measuring and recording cyclotorsion with the double Maddox rod test on seeded virtual patients.',
    loginUrl: `${siteOrigin}/api/lti/login`,
    launchUrl: `${siteOrigin}/api/lti/launch`,
    redirectUris: [`${siteOrigin}/api/lti/launch`],
    deepLinkingUrl: `${siteOrigin}/api/lti/launch`,
    targetLinkUri: `${siteOrigin}/`,
    jwksUrl: `${siteOrigin}/api/lti/jwks`,
    messages: ['LtiResourceLinkRequest', 'LtiDeepLinkingRequest'],
    claims: ['iss', 'sub', 'name', 'given_name', 'family_name', 'email'],
    scopes: [AGS_SCOPE.lineItem, AGS_SCOPE.score],
    privacy: 'Send the person\'s name and e-mail address (Cyclodial names the account after them).',
  }
}
