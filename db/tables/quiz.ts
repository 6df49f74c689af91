// Table types: quizzes, their items, cohorts, sittings, drafts and mark overrides.
import type { ColumnType, Generated } from 'kysely'
import type { Flag, Timestamp } from './columns'

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

/** A tutor's change to one criterion's mark, with the reason: the columns both kinds of attempt share. */
interface MarkOverrideColumns {
  id: Generated<number>
  quiz_id: number
  criterion: string
  previous_score: number
  score: number
  reason: string
  actor_id: number | null
  created_at: Timestamp
}

/** A tutor's change to one criterion's mark on an attempt, with the reason. */
export interface QuizMarkOverridesTable extends MarkOverrideColumns {
  attempt_id: number
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
export interface QuizFundusOverridesTable extends MarkOverrideColumns {
  fundus_attempt_id: number
}
