// Table types: people, cohorts, invitations, resets, sessions, audit and mail.
import type { ColumnType, Generated } from 'kysely'
import type { Role } from '../../shared/auth/roles'
import type { Flag, Timestamp } from './columns'

export interface UsersTable {
  id: Generated<number>
  email: string
  name: string
  role: Role
  password_hash: string
  disabled: ColumnType<Flag, Flag | undefined, Flag>
  created_at: Timestamp
  updated_at: Timestamp
  last_login_at: Timestamp | null
}

export interface CohortsTable {
  id: Generated<number>
  name: string
  created_at: Timestamp
  updated_at: Timestamp
}

/** Students belong to one cohort; tutors may teach several. */
export interface CohortMembersTable {
  cohort_id: number
  user_id: number
  created_at: Timestamp
}

export interface InvitationsTable {
  id: Generated<number>
  email: string
  /** The invitee's name when known (a roster row); they may change it on accepting. */
  name: ColumnType<string | null, string | null | undefined, string | null>
  role: Role
  cohort_id: number | null
  token_hash: string
  invited_by: number | null
  expires_at: Timestamp
  used_at: Timestamp | null
  created_at: Timestamp
}

export interface PasswordResetsTable {
  id: Generated<number>
  user_id: number
  token_hash: string
  expires_at: Timestamp
  used_at: Timestamp | null
  created_at: Timestamp
  /** 0010: the client address that asked (limits reset e-mails per address). */
  requested_ip: ColumnType<string | null, string | null | undefined, string | null>
}

export interface AuditLogTable {
  id: Generated<number>
  actor_id: number | null
  action: string
  target_type: string | null
  target_id: string | null
  /** JSON text with the details of the change. */
  detail: string | null
  created_at: Timestamp
}

/** Every message the development mail catcher received. */
export interface OutboxTable {
  id: Generated<number>
  message_id: string | null
  from_address: string
  to_address: string
  subject: string
  text_body: string
  html_body: string | null
  received_at: Timestamp
}

/** Mail waiting to be sent (or retried); the record survives a failed send. */
export interface MailJobsTable {
  id: Generated<number>
  to_address: string
  subject: string
  text_body: string
  html_body: string | null
  status: 'pending' | 'sent' | 'failed'
  attempts: number
  last_error: string | null
  next_attempt_at: Timestamp
  created_at: Timestamp
  sent_at: Timestamp | null
  /** Until when one instance holds the job to send it (0015); null = free. */
  lease_until: Generated<Timestamp | null>
  /** Which instance holds the lease (a random id per process). */
  lease_owner: Generated<string | null>
}

export interface LoginFailuresTable {
  id: Generated<number>
  email: string
  ip: string
  created_at: Timestamp
  /** 1 while the attempt is reserved and its password not yet checked (0015). */
  pending: Generated<number>
}

/** 0010: a signed-in session; the sealed cookie carries its id. */
export interface SessionsTable {
  id: string
  user_id: number
  created_at: Timestamp
  last_seen_at: Timestamp
  expires_at: Timestamp
  revoked_at: Timestamp | null
}
