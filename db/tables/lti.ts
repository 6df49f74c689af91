// Table types: learning platforms (LTI 1.3, migration 0013).
import type { ColumnType, Generated } from 'kysely'
import type { Flag, Timestamp } from './columns'

/** 0013: a registered learning platform (LTI 1.3). `deployment_ids` is a JSON array of strings. */
export interface LtiPlatformsTable {
  id: Generated<number>
  name: string
  issuer: string
  client_id: string
  deployment_ids: string
  auth_url: string
  token_url: string
  jwks_url: string
  disabled: ColumnType<Flag, Flag | undefined, Flag>
  created_at: Timestamp
  updated_at: Timestamp
}

/** The tool's own signing keys (JWK JSON); the newest active key signs. */
export interface LtiToolKeysTable {
  kid: string
  alg: string
  public_jwk: string
  private_jwk: string
  active: ColumnType<Flag, Flag | undefined, Flag>
  created_at: Timestamp
}

/** A login started (OIDC third-party initiated login): state and nonce, single use. */
export interface LtiStatesTable {
  state: string
  nonce: string
  platform_id: number
  target_link_uri: string
  expires_at: Timestamp
  used_at: Timestamp | null
  created_at: Timestamp
}

/** Nonces of accepted id_tokens, kept until the token could no longer be valid. */
export interface LtiNoncesTable {
  platform_id: number
  nonce: string
  expires_at: Timestamp
}

/** A verified launch, waiting for the browser that started it (then finished). */
export interface LtiLaunchesTable {
  id: string
  state: string
  platform_id: number
  user_id: number | null
  message_type: string
  claims_json: string
  expires_at: Timestamp
  finished_at: Timestamp | null
  created_at: Timestamp
}

/** The platform's person (issuer + subject) linked to a Cyclodial account. */
export interface LtiUsersTable {
  platform_id: number
  subject: string
  user_id: number
  created_at: Timestamp
}

/** A course (LTI context) linked to a cohort. */
export interface LtiContextsTable {
  id: Generated<number>
  platform_id: number
  deployment_id: string
  context_id: string
  title: string | null
  cohort_id: number | null
  created_at: Timestamp
}

/** A resource link in a course, bound to a quiz, with its line item (AGS). */
export interface LtiResourceLinksTable {
  id: Generated<number>
  platform_id: number
  deployment_id: string
  resource_link_id: string
  context_id: number | null
  quiz_id: number | null
  line_item_url: string | null
  ags_scopes: string | null
  created_at: Timestamp
  updated_at: Timestamp
}

/** A score to post to a line item (or posted), with retries. */
export interface LtiGradeJobsTable {
  id: Generated<number>
  quiz_id: number
  student_id: number
  resource_link_id: number
  score_given: number
  score_maximum: number
  reason: 'release' | 'override' | 'resend'
  status: 'pending' | 'sent' | 'failed' | 'superseded'
  attempts: ColumnType<number, number | undefined, number>
  last_error: string | null
  next_attempt_at: Timestamp
  created_at: Timestamp
  sent_at: Timestamp | null
}
