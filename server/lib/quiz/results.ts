// The results of a quiz: one row per assigned student, one cell per item. The
// attempt that counts is the student's last submitted attempt on the item; a
// tutor's overrides replace single criteria; the interpretation step (when the
// quiz asks for it) counts as one more criterion with its own weight. Each item
// kind's attempts, overrides, drafts and marks come from its registry entry
// (server/lib/quiz/item-kinds.ts): a fundus item's attempt is a fundus_attempts row.
import type { Kysely } from 'kysely'
import type { QuizCriterion } from '#shared/schemas/quiz'
import { QUIZ_CRITERIA, QUIZ_ITEM_KINDS, criteriaOfKind } from '#shared/schemas/quiz'
import { cappedPoints } from '#shared/engine/marking'
import type { Database, QuizRow, QuizSittingRow } from '~~/db/schema'
import type { QuizItemConfig } from './items'
import { readItemConfig } from './items'
import { quizStudents } from './access'
import type { ItemCell, StudentResult } from '#shared/types/quiz'
import { sittingEnd, sittingStatus } from './timing'
import type { OverrideRow } from '~~/server/lib/data/mark-overrides'
import { quizItems } from '~~/server/lib/data/quiz-items'
import type { QuizAttemptBase } from './item-kinds'
import { itemKind } from './item-kinds'

export interface ItemColumn {
  id: number
  position: number
  config: QuizItemConfig
  /** Criteria shown for the item: those that count (weight > 0) and appear in its marks. */
  criteria: QuizCriterion[]
  /** Points available on the item (the largest possible seen, else from the weights). */
  possible: number
}

/** `reach`: the cohorts whose students the caller may see (a tutor's own; see quizReach). */
export async function computeResults(db: Kysely<Database>, quiz: QuizRow, now: Date = new Date(), reach: number[] | 'all' = 'all'): Promise<{ columns: ItemColumn[], rows: StudentResult[] }> {
  const itemRows = await quizItems(db, quiz.id)
  const interpretationOn = quiz.interpretation === 1
  // per kind: its quiz attempts (oldest first), the overrides on them by attempt, its drafts
  const [students, sittings, kinds] = await Promise.all([
    quizStudents(db, quiz.id, reach),
    db.selectFrom('quiz_sittings').selectAll().where('quiz_id', '=', quiz.id).execute(),
    Promise.all(QUIZ_ITEM_KINDS.map(async (kind) => {
      const entry = itemKind(kind)
      const [attempts, overrides, drafts] = await Promise.all([entry.attempts(db, quiz.id), entry.overrides(db, quiz.id), entry.drafts(db, quiz.id)])
      const overridesOf = new Map<number, OverrideRow[]>()
      for (const o of overrides) overridesOf.set(o.attempt_id, [...(overridesOf.get(o.attempt_id) ?? []), o])
      // each student's attempts on each item, oldest first
      const onItem = new Map<string, QuizAttemptBase[]>()
      for (const a of attempts) onItem.set(`${a.learner_id}/${a.quiz_item_id}`, [...(onItem.get(`${a.learner_id}/${a.quiz_item_id}`) ?? []), a])
      return [kind, { entry, onItem, overridesOf, drafts }] as const
    })),
  ])
  const ofKind = new Map(kinds)
  const sittingOf = new Map<number, QuizSittingRow>(sittings.map(s => [s.student_id, s]))
  const hasDraft = new Set(kinds.flatMap(([, k]) => k.drafts).map(d => `${d.owner_id}/${d.quiz_item_id}`))

  const columns: ItemColumn[] = itemRows.map((r) => {
    const config = readItemConfig(r)
    return { id: r.id, position: r.position, config, criteria: [], possible: itemKind(config.kind).nominalPossible(config, interpretationOn) }
  })
  const seenCriteria = new Map<number, Set<QuizCriterion>>(columns.map(c => [c.id, new Set()]))
  const maxPossible = new Map<number, number>()

  const rows: StudentResult[] = students.map((st) => {
    const sitting = sittingOf.get(st.id)
    const items: Record<number, ItemCell> = {}
    let earned = 0
    let slips = 0
    let lastSubmit: string | null = null
    for (const col of columns) {
      // each kind's attempts are rows of its own table (their ids are their own)
      const kind = ofKind.get(col.config.kind)!
      const onItem = kind.onItem.get(`${st.id}/${col.id}`) ?? []
      const counted = onItem.at(-1)
      if (!counted) {
        items[col.id] = { attemptId: null, attempts: 0, submittedAt: null, earned: null, possible: null, marks: [], slips: [], cap: null, overridden: false, draftOnly: hasDraft.has(`${st.id}/${col.id}`) }
        continue
      }
      const marks = kind.entry.marks(counted, col.config, interpretationOn, kind.overridesOf.get(counted.id) ?? [])
      const slipCodes = kind.entry.slips(counted)
      const pts = cappedPoints(marks, slipCodes.map(code => ({ code })))
      for (const m of marks) if (m.weight > 0) seenCriteria.get(col.id)!.add(m.criterion)
      maxPossible.set(col.id, Math.max(maxPossible.get(col.id) ?? 0, pts.possible))
      items[col.id] = {
        attemptId: counted.id,
        attempts: onItem.length,
        submittedAt: counted.submitted_at,
        earned: pts.earned,
        possible: pts.possible,
        marks,
        slips: slipCodes,
        cap: pts.cap,
        overridden: marks.some(m => m.override),
        draftOnly: false,
      }
      earned += pts.earned
      slips += slipCodes.length
      if (!lastSubmit || counted.submitted_at > lastSubmit) lastSubmit = counted.submitted_at
    }
    const end = sitting ? sittingEnd(sitting, now) ?? lastSubmit : null
    return {
      studentId: st.id,
      name: st.name,
      email: st.email,
      cohortId: st.cohortId,
      cohortName: st.cohortName,
      status: sittingStatus(sitting, now),
      startedAt: sitting?.started_at ?? null,
      finishedAt: sitting ? sittingEnd(sitting, now) : null,
      timeTakenMs: sitting && end ? Math.max(0, Date.parse(end) - Date.parse(sitting.started_at)) : null,
      items,
      earned,
      possible: 0,
      score: 0,
      slips,
    }
  })

  for (const col of columns) {
    const seen = seenCriteria.get(col.id)!
    col.criteria = seen.size
      ? QUIZ_CRITERIA.filter(c => seen.has(c))
      : criteriaOfKind(col.config.kind).filter(c => col.config.weights[c]! > 0 && !(c === 'action' || c === 'reason') && (c !== 'interpretation' || interpretationOn))
    col.possible = maxPossible.get(col.id) ?? col.possible
  }
  for (const r of rows) {
    // an unsubmitted item still counts: it is worth what the item offers, earned 0
    r.possible = columns.reduce((a, c) => a + (r.items[c.id]?.possible ?? c.possible), 0)
    r.score = r.possible ? r.earned / r.possible : 0
  }
  return { columns, rows }
}
