// The quiz item kinds, one entry each: where a kind's attempts are stored, where a
// tutor's overrides on them go, how an attempt is marked, what an attempt's page
// shows and what the student's quiz page gets once feedback opens. Results, the
// student's quiz, the attempt routes and the override routes read a kind through
// this registry only, so a new kind is one entry here (and its item config, sitting
// and pages; see docs/dev/item-kinds.md). `satisfies Record<QuizItemKind, …>` makes
// a kind without an entry a type error; tests/unit/quiz/item-kinds.test.ts checks
// the same at run time and drives every entry on a real database.
import type { Kysely } from 'kysely'
import type { SessionUserData } from '#shared/auth/roles'
import type { QuizCriterion, QuizItemKind } from '#shared/schemas/quiz'
import { KIND_ATTEMPT_PATHS, KIND_CRITERIA } from '#shared/schemas/quiz'
import type { FundusGradeResult } from '#shared/engine/fundus/result'
import type { EffectiveMark, QuizAttemptView, QuizFundusAttemptView, StudentQuizItem } from '#shared/types/quiz'
import type { AttemptRow, Database, FundusAttemptRow, QuizItemRow, QuizRow } from '~~/db/schema'
import type { AttemptTable } from '~~/server/lib/data/attempts'
import { quizAttemptById, quizAttemptsOf } from '~~/server/lib/data/attempts'
import type { OverrideRow, OverrideTable } from '~~/server/lib/data/mark-overrides'
import { markOverridesOf } from '~~/server/lib/data/mark-overrides'
import type { DraftOwner } from '~~/server/lib/data/quiz-drafts'
import { benchDraftsOf, fundusDraftsOf } from '~~/server/lib/data/quiz-drafts'
import type { DmrItemConfig, FundusItemConfig, QuizItemConfig } from './items'
import { applyOverrides, effectiveMarks, fundusMarksOf } from './marks'
import { quizAttemptView } from './attempt-view'
import { quizFundusAttemptView } from './fundus-attempt-view'
import { attemptFeedback } from './feedback'
import { fundusFeedbackOf, fundusItemPictures } from './fundus-item'
import { quizCaseRow } from './sitting'

/** What every attempt table has: enough to count, order and place an attempt. */
export type QuizAttemptBase = Pick<AttemptRow, 'id' | 'learner_id' | 'quiz_item_id' | 'submitted_at'>

/**
 * One kind of quiz item. Methods (not arrow properties) so that an entry for one
 * kind's rows and config also serves as the general `AnyItemKind`.
 */
export interface ItemKind<K extends QuizItemKind, Row extends QuizAttemptBase, Config extends QuizItemConfig, View> {
  readonly kind: K
  /** The table its attempts are stored in (their ids are that table's). */
  readonly attemptTable: AttemptTable
  /** The table a tutor's overrides on its attempts are stored in. */
  readonly overrideTable: OverrideTable
  /** The audit log's target type for an override on its attempts. */
  readonly auditTarget: 'attempt' | 'fundus-attempt'
  /** The path segment of its attempt routes and pages: `/quizzes/:id/<segment>/:attemptId`. */
  readonly attemptPath: (typeof KIND_ATTEMPT_PATHS)[K]
  /** One quiz attempt of the quiz (only the learner's own when `learnerId` is given). */
  attempt(db: Kysely<Database>, key: { quizId: number, attemptId: number, learnerId?: number }): Promise<Row | undefined>
  /** Every quiz attempt on the quiz (only one learner's when given), oldest first. */
  attempts(db: Kysely<Database>, quizId: number, learnerId?: number): Promise<Row[]>
  /** Who has unsubmitted work saved on which item (only one student's when given). */
  drafts(db: Kysely<Database>, quizId: number, studentId?: number): Promise<DraftOwner[]>
  /** Every override on the quiz's attempts of this kind. */
  overrides(db: Kysely<Database>, quizId: number): Promise<OverrideRow[]>
  /** The attempt's marks as they stand (the attempt's own overrides applied). */
  marks(attempt: Row, config: Config, interpretationOn: boolean, overrides: OverrideRow[]): EffectiveMark[]
  /** Codes of the record slips the attempt made (only a written record has slips). */
  slips(attempt: Row): string[]
  /** Points the item is worth before anyone sits it: the weights of the criteria a normal attempt marks. */
  nominalPossible(config: Config, interpretationOn: boolean): number
  /** Why an override may not name this criterion at all, or null (asked before the marks are read). */
  criterionProblem(criterion: QuizCriterion): string | null
  /** The attempt's page: `GET /api/quizzes/:id/<attemptPath>/:attemptId`. */
  view(db: Kysely<Database>, viewer: SessionUserData, quiz: QuizRow, attempt: Row): Promise<View>
  /** What the student's quiz page shows of the attempt that counts once feedback is open. */
  studentFeedback(db: Kysely<Database>, quiz: QuizRow, item: QuizItemRow, config: Config, last: Row, studentId: number): Promise<Pick<StudentQuizItem, 'feedback' | 'fundusFeedback'>>
}

/** Any kind's entry, as code that serves every kind reads it. */
export type AnyItemKind = ItemKind<QuizItemKind, QuizAttemptBase, QuizItemConfig, unknown>

/** The criteria a written double Maddox rod record marks (action and reason only with a three-step case). */
const RECORD_CRITERIA: QuizCriterion[] = ['measurement', 'direction', 'amount', 'eye', 'test', 'gaze', 'distance']

/** A kind's reads of its own attempt and override tables. */
function storedIn<T extends AttemptTable>(attemptTable: T, overrideTable: OverrideTable) {
  return {
    attemptTable,
    overrideTable,
    attempt: (db: Kysely<Database>, key: { quizId: number, attemptId: number, learnerId?: number }) => quizAttemptById(db, attemptTable, key),
    attempts: (db: Kysely<Database>, quizId: number, learnerId?: number) => quizAttemptsOf(db, attemptTable, quizId, learnerId),
    overrides: (db: Kysely<Database>, quizId: number) => markOverridesOf(db, overrideTable, quizId),
  }
}

const dmr: ItemKind<'dmr', AttemptRow, DmrItemConfig, QuizAttemptView> = {
  kind: 'dmr',
  ...storedIn('attempts', 'quiz_mark_overrides'),
  auditTarget: 'attempt',
  attemptPath: KIND_ATTEMPT_PATHS.dmr,
  drafts: benchDraftsOf,
  marks: effectiveMarks,
  slips: attempt => (JSON.parse(attempt.slips_json) as { code: string }[]).map(s => s.code),
  nominalPossible: (config, interpretationOn) => RECORD_CRITERIA.reduce((a, c) => a + config.weights[c], 0) + (interpretationOn ? config.weights.interpretation : 0),
  criterionProblem: () => null,
  view: quizAttemptView,
  studentFeedback: async (db, quiz, _item, config, last) => ({ feedback: await attemptFeedback(db, last, config, quiz.interpretation === 1) }),
}

const fundus: ItemKind<'fundus', FundusAttemptRow, FundusItemConfig, QuizFundusAttemptView> = {
  kind: 'fundus',
  ...storedIn('fundus_attempts', 'quiz_fundus_overrides'),
  auditTarget: 'fundus-attempt',
  attemptPath: KIND_ATTEMPT_PATHS.fundus,
  drafts: fundusDraftsOf,
  marks: (attempt, config, _interpretationOn, overrides) => applyOverrides(fundusMarksOf(JSON.parse(attempt.result_json) as FundusGradeResult, config.weights), overrides),
  // slips are the double Maddox rod record's; a fundus item has marks, not record slips
  slips: () => [],
  nominalPossible: config => config.weights.fundusAngle + config.weights.fundusFinding,
  criterionProblem: criterion => KIND_CRITERIA.fundus.includes(criterion)
    ? null
    : `A fundus item marks ${KIND_CRITERIA.fundus.join(' and ')}; it has no “${criterion}” mark.`,
  view: quizFundusAttemptView,
  studentFeedback: async (db, quiz, item, config, last, studentId) => {
    const caseRow = config.source.type === 'photo' ? null : (await quizCaseRow(db, quiz.id, item.id, studentId)) ?? null
    const overrides = await fundus.overrides(db, quiz.id)
    return { fundusFeedback: fundusFeedbackOf(last, config, fundusItemPictures(config, caseRow, last.fundus_version ?? undefined), overrides) }
  },
}

/** Every kind's entry (a kind of `QUIZ_ITEM_KINDS` without one does not compile). */
export const ITEM_KINDS = { dmr, fundus } as const satisfies Record<QuizItemKind, AnyItemKind>

/** The entry of an item's kind, for code that serves every kind. */
export const itemKind = (kind: QuizItemKind): AnyItemKind => ITEM_KINDS[kind]
