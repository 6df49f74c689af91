// The Deep Linking 2.0 response (§4.5): one ltiResourceLink content item (§3.2.3) for the
// chosen quiz, with a line item carrying its maximum score, signed with the tool's key.
import { randomUUID } from 'node:crypto'
import { SignJWT } from 'jose'
import type { Kysely } from 'kysely'
import type { Database, LtiPlatformRow } from '~~/db/schema'
import { CLAIM, CUSTOM_QUIZ, DEEP_LINKING_RESPONSE, LTI_VERSION } from './claims'
import { toolSigningKey } from './keys'

export interface DeepLinkQuiz { id: number, title: string, instructions: string, maxScore: number }

export async function deepLinkingResponse(db: Kysely<Database>, platform: LtiPlatformRow, request: Record<string, unknown>, quiz: DeepLinkQuiz, siteOrigin: string): Promise<{ returnUrl: string, jwt: string }> {
  const settings = request[CLAIM.deepLinkingSettings] as { deep_link_return_url: string, data?: unknown }
  const key = await toolSigningKey(db)
  const item = {
    type: 'ltiResourceLink', // Deep Linking 2.0 §3.2.3
    title: quiz.title,
    text: quiz.instructions.slice(0, 500) || undefined,
    url: `${siteOrigin}/api/lti/launch`,
    lineItem: { scoreMaximum: quiz.maxScore, label: quiz.title, resourceId: `quiz-${quiz.id}`, tag: 'cyclodial-quiz' }, // Deep Linking 2.0 §3.2.3 lineItem
    custom: { [CUSTOM_QUIZ]: String(quiz.id) },
  }
  const claims: Record<string, unknown> = {
    nonce: randomUUID(),
    [CLAIM.messageType]: DEEP_LINKING_RESPONSE,
    [CLAIM.version]: LTI_VERSION,
    [CLAIM.deploymentId]: request[CLAIM.deploymentId],
    [CLAIM.contentItems]: [item],
  }
  if (settings.data !== undefined) claims[CLAIM.dlData] = settings.data // Deep Linking 2.0 §4.5.4: echoed as received
  const jwt = await new SignJWT(claims)
    .setProtectedHeader({ alg: key.alg, kid: key.kid, typ: 'JWT' })
    .setIssuer(platform.client_id) // Deep Linking 2.0 §4.5.1: iss is the tool's client id
    .setAudience(platform.issuer) // §4.5.1: aud is the platform's issuer
    .setIssuedAt()
    .setExpirationTime('5m')
    .setJti(randomUUID())
    .sign(key.key)
  return { returnUrl: settings.deep_link_return_url, jwt }
}
