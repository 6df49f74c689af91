// The Kysely Database interface: one table type per table. SQLite returns
// booleans as 0/1 and timestamps as ISO-8601 text, so the types say so.
import type { ColumnType, Generated, Insertable, Selectable, Updateable } from 'kysely'

export type Role = 'student' | 'tutor' | 'lecturer' | 'admin'
/** ISO-8601 UTC timestamp stored as text. */
export type Timestamp = string
export type Flag = 0 | 1

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
}

export interface LoginFailuresTable {
  id: Generated<number>
  email: string
  ip: string
  created_at: Timestamp
}

export interface Database {
  users: UsersTable
  cohorts: CohortsTable
  cohort_members: CohortMembersTable
  invitations: InvitationsTable
  password_resets: PasswordResetsTable
  audit_log: AuditLogTable
  outbox: OutboxTable
  mail_jobs: MailJobsTable
  login_failures: LoginFailuresTable
}

export type User = Selectable<UsersTable>
export type NewUser = Insertable<UsersTable>
export type UserUpdate = Updateable<UsersTable>
export type Cohort = Selectable<CohortsTable>
export type Invitation = Selectable<InvitationsTable>
export type AuditEntry = Selectable<AuditLogTable>
export type OutboxMessage = Selectable<OutboxTable>
export type MailJob = Selectable<MailJobsTable>
