// Table types: cases, attempts and their slips, patient turns, the casebook and practice sets.
import type { ColumnType, Generated } from 'kysely'
import type { Flag, Timestamp } from './columns'

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
  /** 0007: the attempt's distinct slips as one sorted key (shared/review/slip-set.ts); '' when clean. */
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
