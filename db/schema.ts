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

export type CasePurpose = 'practice' | 'quiz' | 'preview'
export type AttemptKind = 'practice' | 'quiz'
/** 'excyclo' | 'incyclo' | 'none', or null when the record left it out. */
export type StoredDirection = string | null

/** One virtual patient: a template + seed (or a hand-authored spec) + generator version. */
export interface CasesTable {
  id: Generated<number>
  owner_id: number | null
  purpose: CasePurpose
  template_id: string | null
  /** 1 when the learner asked for "any": the template is not named until the truth is due. */
  template_hidden: ColumnType<Flag, Flag | undefined, Flag>
  spec_id: number | null
  /** Snapshot of a hand-authored case, so replay never depends on later edits. */
  spec_json: string | null
  seed: string
  generator_version: number
  /** Server-only copy of the condition, for filters; never sent before the truth is due. */
  condition: string
  difficulty: string
  mode: 'learner-turns' | 'patient-turns'
  read_scale: ColumnType<Flag, Flag | undefined, Flag>
  quiz_id: number | null
  quiz_item_id: number | null
  practice_set_id: number | null
  /** Patient-turns: how many times the patient has been asked to turn the rods. */
  trial_count: ColumnType<number, number | undefined, number>
  /** Autosaved bench state (JSON) while the learner works. */
  draft_json: string | null
  created_at: Timestamp
  updated_at: Timestamp
}

/** A submitted attempt with everything needed to replay and review it. */
export interface AttemptsTable {
  id: Generated<number>
  case_id: number
  learner_id: number
  /** The learner's cohort when they submitted. */
  cohort_id: number | null
  kind: AttemptKind
  quiz_id: number | null
  quiz_item_id: number | null
  practice_set_id: number | null
  template_id: string | null
  condition: string
  difficulty: string
  mode: 'learner-turns' | 'patient-turns'
  seed: string
  generator_version: number
  gaze: string
  distance: string
  readings_json: string
  prisms_json: string
  lights: ColumnType<string, string | undefined, string>
  trial: number | null
  record_text: string
  parsed_json: string
  marks_json: string
  interpretation_json: string | null
  /** Weighted score 0–1. */
  score: number
  points_earned: number
  points_possible: number
  slips_json: string
  /** CaseTruth snapshot at grading time. */
  truth_json: string
  re_true_direction: StoredDirection
  re_recorded_direction: StoredDirection
  le_true_direction: StoredDirection
  le_recorded_direction: StoredDirection
  /** Recorded amount minus the true magnitude, degrees (null when not recorded). */
  re_amount_error: number | null
  le_amount_error: number | null
  started_at: Timestamp | null
  submitted_at: Timestamp
  duration_ms: number | null
  /** 0006: the "read as" line, the model record and the explanation exactly as first shown. */
  read_as: string | null
  model_record: string | null
  explanation_json: string | null
  /** 0007: the attempt's distinct slips as one sorted key (shared/review/slipSet.ts); '' when clean. */
  slip_set: string
  /**
   * 0012: the eye whose direction was reversed while the other eye (true torsion 1° or
   * more) was recorded the right way — evidence of a rule swap (ruleSwapEvidence); else null.
   */
  rule_swap_eye: ColumnType<string | null, string | null | undefined, string | null>
}

/** One row per slip on an attempt, denormalised for fast aggregation. */
export interface AttemptSlipsTable {
  id: Generated<number>
  attempt_id: number
  learner_id: number
  cohort_id: number | null
  kind: AttemptKind
  quiz_id: number | null
  template_id: string | null
  condition: string
  code: string
  eye: 'RE' | 'LE' | null
  created_at: Timestamp
}

/** 0006: one row per time the patient turned the rods on a patient-turns case. */
export interface CaseTurnsTable {
  id: Generated<number>
  case_id: number
  /** 1, 2, 3… per case; the same trial always replays the same setting. */
  trial: number
  gaze: string
  distance: string
  prisms_json: string
  lights: string
  /** PatientTurnsResult as first computed. */
  result_json: string
  created_at: Timestamp
}

/** A tutor's case template: an engine template with ranges narrowed within the published ones. */
export interface CasebookTemplatesTable {
  id: Generated<number>
  owner_id: number
  title: string
  /** The engine's template id, e.g. `so-palsy-right-standard`. */
  template_id: string
  /** JSON `{ torsion?: [lo, hi], vertical?: [lo, hi] }` inside the engine template's ranges. */
  ranges_json: string
  tolerance: number
  notes: string | null
  archived_at: Timestamp | null
  created_at: Timestamp
  updated_at: Timestamp
}

/** A hand-authored exact case (caseSpecSchema JSON). */
export interface CasebookCasesTable {
  id: Generated<number>
  owner_id: number
  title: string
  spec_json: string
  tolerance: number
  archived_at: Timestamp | null
  created_at: Timestamp
  updated_at: Timestamp
}

export interface QuizzesTable {
  id: Generated<number>
  owner_id: number | null
  title: string
  /** Shown to students before they start. */
  instructions: ColumnType<string, string | undefined, string>
  /** Per-student cases are derived from this seed, the item and the student id. */
  seed: string
  time_limit_minutes: number | null
  opens_at: Timestamp | null
  closes_at: Timestamp | null
  /** Submissions allowed per item; the last one counts. */
  attempts_allowed: ColumnType<number, number | undefined, number>
  /** 1 when each item also asks for the three-step interpretation. */
  interpretation: ColumnType<Flag, Flag | undefined, Flag>
  /** 1: marks and the truth wait for release; 0: they open when the quiz closes. */
  hold_feedback: ColumnType<Flag, Flag | undefined, Flag>
  published_at: Timestamp | null
  released_at: Timestamp | null
  released_by: number | null
  archived_at: Timestamp | null
  duplicated_from: number | null
  created_at: Timestamp
  updated_at: Timestamp
}

/** One item of a quiz. `kind` says how `config_json` reads ('dmr' now; more kinds later). */
export interface QuizItemsTable {
  id: Generated<number>
  quiz_id: number
  position: number
  kind: string
  /** What the student is asked (student-facing: must not name the condition). */
  prompt: ColumnType<string, string | undefined, string>
  config_json: string
  created_at: Timestamp
  updated_at: Timestamp
}

export interface QuizCohortsTable {
  quiz_id: number
  cohort_id: number
  created_at: Timestamp
}

/** One student's sitting of a quiz: when it started and the deadline the server enforces. */
export interface QuizSittingsTable {
  id: Generated<number>
  quiz_id: number
  student_id: number
  started_at: Timestamp
  /** min(start + time limit, close time); null = no deadline. */
  deadline_at: Timestamp | null
  /** Set when the student finishes the quiz. */
  finished_at: Timestamp | null
}

/** A tutor's change to one criterion's mark on an attempt, with the reason. */
export interface QuizMarkOverridesTable {
  id: Generated<number>
  attempt_id: number
  quiz_id: number
  criterion: string
  previous_score: number
  score: number
  reason: string
  actor_id: number | null
  created_at: Timestamp
}

/** A targeted practice set sent from the slip-patterns page (cases in `cases.practice_set_id`). */
export interface PracticeSetsTable {
  id: Generated<number>
  created_by: number | null
  /** The cohort it was sent to (scope 'cohort') or the learners' cohort (scope 'learner'). */
  cohort_id: number | null
  scope: 'learner' | 'cohort'
  /** A learner-pattern code (shared/review/patterns.ts) the cases exercise. */
  focus: string
  eye: 'RE' | 'LE' | null
  title: string
  note: string | null
  /** Cases per learner. */
  size: number
  mode: 'learner-turns' | 'patient-turns'
  created_at: Timestamp
}

/** Who received a practice set, and when (the before/after split of the slip rate). */
export interface PracticeSetLearnersTable {
  set_id: number
  learner_id: number
  sent_at: Timestamp
  mail_job_id: number | null
}

/** A tutor's fundus photograph: the file sits under the data folder, never in public/. */
export interface FundusPhotosTable {
  id: Generated<number>
  owner_id: number | null
  title: string
  eye: 'RE' | 'LE'
  notes: string | null
  /** File name inside the photo folder (random; never the uploaded name). */
  storage_name: string
  mime: 'image/jpeg' | 'image/png'
  byte_size: number
  width: number
  height: number
  /** Reference marks in image pixels (x right, y down); null until the tutor marks them. */
  disc_x: number | null
  disc_y: number | null
  fovea_x: number | null
  fovea_y: number | null
  reference_angle: number | null
  marked_at: Timestamp | null
  created_at: Timestamp
  updated_at: Timestamp
}

export interface FundusPhotoCohortsTable {
  photo_id: number
  cohort_id: number
}

/** A learner's disc–fovea measurement on a case's fundus or an uploaded photograph. */
export interface FundusAttemptsTable {
  id: Generated<number>
  learner_id: number
  cohort_id: number | null
  kind: AttemptKind
  case_id: number | null
  photo_id: number | null
  quiz_id: number | null
  quiz_item_id: number | null
  /** FUNDUS_VERSION that drew a case's fundus (null for photographs). */
  fundus_version: number | null
  marks_json: string
  result_json: string
  score: number
  re_angle: number | null
  le_angle: number | null
  submitted_at: Timestamp
}

/** 0009: a student's autosaved marks on a fundus quiz item. */
export interface QuizFundusDraftsTable {
  quiz_item_id: number
  student_id: number
  quiz_id: number
  draft_json: string
  saved_at: Timestamp
}

/** 0009: a tutor's change to one criterion of a fundus quiz attempt, with the reason. */
export interface QuizFundusOverridesTable {
  id: Generated<number>
  fundus_attempt_id: number
  quiz_id: number
  criterion: string
  previous_score: number
  score: number
  reason: string
  actor_id: number | null
  created_at: Timestamp
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
