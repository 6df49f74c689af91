// The Kysely Database interface: one table type per table (the table types are in
// db/tables/, by area). SQLite returns booleans as 0/1 and timestamps as ISO-8601
// text, so the types say so.
import type { Insertable, Selectable, Updateable } from 'kysely'
import type { UsersTable, CohortsTable, CohortMembersTable, InvitationsTable, PasswordResetsTable, AuditLogTable, OutboxTable, MailJobsTable, LoginFailuresTable, SessionsTable } from './tables/people'
import type { CasesTable, AttemptsTable, AttemptSlipsTable, CaseTurnsTable, CasebookTemplatesTable, CasebookCasesTable, PracticeSetsTable, PracticeSetLearnersTable } from './tables/practice'
import type { QuizzesTable, QuizItemsTable, QuizCohortsTable, QuizSittingsTable, QuizMarkOverridesTable, QuizFundusDraftsTable, QuizFundusOverridesTable } from './tables/quiz'
import type { FundusPhotosTable, FundusPhotoCohortsTable, FundusAttemptsTable } from './tables/fundus'
import type { LtiPlatformsTable, LtiToolKeysTable, LtiStatesTable, LtiNoncesTable, LtiLaunchesTable, LtiUsersTable, LtiContextsTable, LtiResourceLinksTable, LtiGradeJobsTable } from './tables/lti'

export type * from './tables/columns'
export type * from './tables/people'
export type * from './tables/practice'
export type * from './tables/quiz'
export type * from './tables/fundus'
export type * from './tables/lti'

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
  sessions: SessionsTable
  cases: CasesTable
  attempts: AttemptsTable
  attempt_slips: AttemptSlipsTable
  case_turns: CaseTurnsTable
  casebook_templates: CasebookTemplatesTable
  casebook_cases: CasebookCasesTable
  quizzes: QuizzesTable
  quiz_items: QuizItemsTable
  quiz_cohorts: QuizCohortsTable
  quiz_sittings: QuizSittingsTable
  quiz_mark_overrides: QuizMarkOverridesTable
  practice_sets: PracticeSetsTable
  practice_set_learners: PracticeSetLearnersTable
  fundus_photos: FundusPhotosTable
  fundus_photo_cohorts: FundusPhotoCohortsTable
  fundus_attempts: FundusAttemptsTable
  quiz_fundus_drafts: QuizFundusDraftsTable
  quiz_fundus_overrides: QuizFundusOverridesTable
  lti_platforms: LtiPlatformsTable
  lti_tool_keys: LtiToolKeysTable
  lti_states: LtiStatesTable
  lti_nonces: LtiNoncesTable
  lti_launches: LtiLaunchesTable
  lti_users: LtiUsersTable
  lti_contexts: LtiContextsTable
  lti_resource_links: LtiResourceLinksTable
  lti_grade_jobs: LtiGradeJobsTable
}

export type User = Selectable<UsersTable>
export type NewUser = Insertable<UsersTable>
export type UserUpdate = Updateable<UsersTable>
export type Cohort = Selectable<CohortsTable>
export type Invitation = Selectable<InvitationsTable>
export type AuditEntry = Selectable<AuditLogTable>
export type OutboxMessage = Selectable<OutboxTable>
export type MailJob = Selectable<MailJobsTable>
export type CaseRow = Selectable<CasesTable>
export type AttemptRow = Selectable<AttemptsTable>
export type QuizRow = Selectable<QuizzesTable>
export type QuizItemRow = Selectable<QuizItemsTable>
export type QuizSittingRow = Selectable<QuizSittingsTable>
export type FundusPhotoRow = Selectable<FundusPhotosTable>
export type FundusAttemptRow = Selectable<FundusAttemptsTable>
export type LtiPlatformRow = Selectable<LtiPlatformsTable>
export type LtiResourceLinkRow = Selectable<LtiResourceLinksTable>
