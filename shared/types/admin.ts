// Response types of the administrators' routes (server/api/admin/, auth).
import type { Role, SessionUserData } from '../auth/roles'
import type { Page } from './common'

/** GET /api/auth/me, POST /api/invitations/:token/accept: who is signed in and their home page. */
export interface SignedInReply { user: SessionUserData, home: string }

/** POST /api/auth/logout-everywhere. */
export interface SignedOutEverywhere { ok: true, ended: number, message: string }

export interface AdminOverview {
  people: Partial<Record<string, number>>
  cohorts: number
  pendingInvitations: number
  mailWaiting: number
}

export interface AdminUserRow {
  id: number
  email: string
  name: string
  role: Role
  disabled: boolean
  createdAt: string
  lastLoginAt: string | null
  cohorts: CohortName[]
}
export type AdminUserPage = Page<AdminUserRow>

/** PATCH /api/admin/users/:id: the person as changed. */
export interface AdminUserChanged { id: number, email: string, name: string, role: Role, disabled: boolean, cohorts: CohortName[] }

export interface CohortName { id: number, name: string }

export interface AdminCohortRow { id: number, name: string, createdAt: string, students: number, staff: number }
export interface AdminCohortList { items: AdminCohortRow[] }

export interface AdminInvitationRow {
  id: number
  email: string
  role: Role
  cohortName: string | null
  createdAt: string
  expiresAt: string
  state: 'accepted' | 'expired' | 'pending'
}
export type AdminInvitationPage = Page<AdminInvitationRow>

/** POST /api/admin/invitations. */
export interface InvitationSent { id: number, email: string, mailSent: boolean, message: string }

export interface AuditRow {
  id: number
  action: string
  target: string | null
  detail: unknown
  actorName: string
  createdAt: string
  /** The row in plain words for the page. */
  words: { action: string, target: string | null, changes: string[] }
}
export type AuditPage = Page<AuditRow>

export interface OutboxRow { id: number, from: string, to: string, subject: string, receivedAt: string }
export interface MailJobRow { id: number, to: string, subject: string, status: string, attempts: number, lastError: string | null, nextAttemptAt: string }
export interface OutboxPage extends Page<OutboxRow> { catcher: boolean, queue: MailJobRow[] }
export interface OutboxMessage extends OutboxRow { messageId: string | null, text: string }
