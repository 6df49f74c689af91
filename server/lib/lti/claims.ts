// Claim names and values of LTI 1.3, Deep Linking 2.0 and Assignment and Grade Services 2.0.
// The spec sections are named beside each value.

const LTI = 'https://purl.imsglobal.org/spec/lti/claim/'
export const CLAIM = {
  messageType: `${LTI}message_type`, // LTI Core 1.3 §5.3.1
  version: `${LTI}version`, // LTI Core 1.3 §5.3.2
  deploymentId: `${LTI}deployment_id`, // LTI Core 1.3 §5.3.3
  targetLinkUri: `${LTI}target_link_uri`, // LTI Core 1.3 §5.3.4
  resourceLink: `${LTI}resource_link`, // LTI Core 1.3 §5.3.5
  roles: `${LTI}roles`, // LTI Core 1.3 §5.3.7
  context: `${LTI}context`, // LTI Core 1.3 §5.4.1
  custom: `${LTI}custom`, // LTI Core 1.3 §5.4.6
  deepLinkingSettings: 'https://purl.imsglobal.org/spec/lti-dl/claim/deep_linking_settings', // Deep Linking 2.0 §4.4.1
  contentItems: 'https://purl.imsglobal.org/spec/lti-dl/claim/content_items', // Deep Linking 2.0 §4.5.3
  dlData: 'https://purl.imsglobal.org/spec/lti-dl/claim/data', // Deep Linking 2.0 §4.5.4
  agsEndpoint: 'https://purl.imsglobal.org/spec/lti-ags/claim/endpoint', // AGS 2.0 §3.1
} as const

export const LTI_VERSION = '1.3.0' // LTI Core 1.3 §5.3.2
export const RESOURCE_LINK_REQUEST = 'LtiResourceLinkRequest' // LTI Core 1.3 §5.3.1
export const DEEP_LINKING_REQUEST = 'LtiDeepLinkingRequest' // Deep Linking 2.0 §4.4
export const DEEP_LINKING_RESPONSE = 'LtiDeepLinkingResponse' // Deep Linking 2.0 §4.5

export const AGS_SCOPE = {
  lineItem: 'https://purl.imsglobal.org/spec/lti-ags/scope/lineitem', // AGS 2.0 §3.1
  lineItemReadOnly: 'https://purl.imsglobal.org/spec/lti-ags/scope/lineitem.readonly', // AGS 2.0 §3.1
  score: 'https://purl.imsglobal.org/spec/lti-ags/scope/score', // AGS 2.0 §3.1
} as const
export const SCORE_MEDIA_TYPE = 'application/vnd.ims.lis.v1.score+json' // AGS 2.0 §3.4
/** RFC 7523 §2.2: a JWT used as a client assertion. */
export const JWT_BEARER_ASSERTION = 'urn:ietf:params:oauth:client-assertion-type:jwt-bearer'

/** The custom parameter a deep-linked resource link carries back on launch (our own name). */
export const CUSTOM_QUIZ = 'cyclodial_quiz'

// Role vocabularies: LTI Core 1.3 Appendix A.2 (context roles) and A.1 (system and institution roles).
const MEMBERSHIP = 'http://purl.imsglobal.org/vocab/lis/v2/membership#'
const INSTITUTION = 'http://purl.imsglobal.org/vocab/lis/v2/institution/person#'
const SYSTEM = 'http://purl.imsglobal.org/vocab/lis/v2/system/person#'

export type MappedRole = 'student' | 'tutor'

/**
 * Which Cyclodial role the platform's roles give in this course: instructor-like
 * context roles (and teaching assistants, a sub-role of Instructor, LTI Core 1.3 §A.2.3)
 * make a tutor; Learner a student. Administrator roles of any kind are never mapped
 * (nor to Cyclodial's administrators). Institution roles count only without a context role.
 */
export function mapRoles(roles: readonly string[]): MappedRole | null {
  const has = (uri: string) => roles.includes(uri)
  const sub = (prefix: string) => roles.some(r => r.startsWith(prefix))
  if (has(`${MEMBERSHIP}Instructor`) || sub('http://purl.imsglobal.org/vocab/lis/v2/membership/Instructor#') || has(`${MEMBERSHIP}ContentDeveloper`)) return 'tutor'
  if (has(`${MEMBERSHIP}Learner`) || sub('http://purl.imsglobal.org/vocab/lis/v2/membership/Learner#')) return 'student'
  const contextRole = roles.some(r => r.startsWith(MEMBERSHIP) || r.startsWith('http://purl.imsglobal.org/vocab/lis/v2/membership/'))
  if (!contextRole) {
    if (has(`${INSTITUTION}Instructor`) || has(`${INSTITUTION}Faculty`)) return 'tutor'
    if (has(`${INSTITUTION}Student`) || has(`${INSTITUTION}Learner`)) return 'student'
  }
  return null
}

export function onlyAdministratorRoles(roles: readonly string[]): boolean {
  return roles.length > 0 && roles.every(r => /#Administrator$|\/Administrator#/.test(r) || r === `${SYSTEM}Administrator` || r === `${INSTITUTION}Administrator`)
}

export const ROLE_URI = {
  learner: `${MEMBERSHIP}Learner`,
  instructor: `${MEMBERSHIP}Instructor`,
  administrator: `${MEMBERSHIP}Administrator`,
  systemAdministrator: `${SYSTEM}Administrator`,
} as const
