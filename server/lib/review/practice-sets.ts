// Targeted practice sets: created from the slip-patterns page for some learners
// or a whole cohort, stored as ordinary practice cases (cases.practice_set_id)
// owned by each learner, announced by e-mail, and followed up by comparing each
// learner's rate of the focus slip before and after the set was sent.
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'
import type { SlipCode } from '#shared/engine/slips'
import type { Eye } from '#shared/engine/types'
import { PATTERN_INFO, focusSlips } from '#shared/review/patterns'
import type { PatternCode } from '#shared/review/patterns'
import { insertCase } from '~~/server/lib/practice/cases'
import { chooseSetCases, modeForFocus } from './set-cases'

/** The set's title as the learner sees it: what to practise, never the diagnosis. */
export function setTitle(focus: PatternCode, eye?: Eye | null): string {
  switch (focus) {
    case 'image-recorded': return 'Direction: record the eye, not the image'
    case 'left-right-rule-swapped': return eye === 'RE' ? 'Reading the right eye’s dial' : 'Reading the left eye’s dial'
    case 'dial-value-as-amount': return 'Amount: the change from 90°'
    case 'test-unnamed': return 'Complete records: name the test'
    case 'measures-not-records': return 'Setting each rod where its line looks level'
    case 'records-not-measures': return 'From the dial reading to the record'
  }
}

export interface NewSet {
  createdBy: number
  cohortId: number | null
  scope: 'learner' | 'cohort'
  focus: PatternCode
  eye?: Eye
  size: number
  note?: string
  learners: { id: number, email: string, name: string }[]
}

/** Creates the set, its learners and their cases in one transaction; returns the set id. */
export async function createPracticeSet(db: Kysely<Database>, s: NewSet, now: string): Promise<number> {
  return db.transaction().execute(async (trx) => {
    const { id } = await trx.insertInto('practice_sets').values({
      created_by: s.createdBy,
      cohort_id: s.cohortId,
      scope: s.scope,
      focus: s.focus,
      eye: s.eye ?? null,
      title: setTitle(s.focus, s.eye),
      note: s.note || null,
      size: s.size,
      mode: modeForFocus(s.focus),
      created_at: now,
    }).returning('id').executeTakeFirstOrThrow()
    for (const learner of s.learners) {
      await trx.insertInto('practice_set_learners').values({ set_id: id, learner_id: learner.id, sent_at: now, mail_job_id: null }).execute()
      for (const c of chooseSetCases(id, learner.id, s.focus, s.size, s.eye)) {
        // the learner is not told the condition: naming it would give the direction away
        await insertCase(trx, { ownerId: learner.id, purpose: 'practice', mode: modeForFocus(s.focus), templateId: c.templateId, seed: c.seed, templateHidden: true, practiceSetId: id, now })
      }
    }
    await writeAudit(trx, { actorId: s.createdBy, action: 'practice-set.create', targetType: 'practice_set', targetId: id, detail: { focus: s.focus, eye: s.eye ?? null, learners: s.learners.length, size: s.size } })
    return id
  })
}

export interface RateCounts { attempts: number, slipped: number, rate: number | null }
const rate = (slipped: number, attempts: number): RateCounts => ({ attempts, slipped, rate: attempts ? Math.round(1000 * slipped / attempts) / 10 : null })

export interface SetLearnerProgress {
  learner: { id: number, name: string }
  sentAt: string
  casesDone: number
  before: RateCounts
  after: RateCounts
}

/** Each recipient's rate of the focus slip (per 100 attempts) before and after the set was sent. */
export async function setProgress(db: Kysely<Database>, set: { id: number, focus: PatternCode, eye: Eye | null }): Promise<{ learners: SetLearnerProgress[], before: RateCounts, after: RateCounts, slips: readonly SlipCode[] }> {
  const slips = focusSlips(set.focus)
  const recipients = await db.selectFrom('practice_set_learners')
    .innerJoin('users', 'users.id', 'practice_set_learners.learner_id')
    .select(['users.id', 'users.name', 'practice_set_learners.sent_at'])
    .where('practice_set_learners.set_id', '=', set.id).orderBy('users.name').execute()
  if (!recipients.length) return { learners: [], before: rate(0, 0), after: rate(0, 0), slips }
  const ids = recipients.map(r => r.id)
  const attempts = await db.selectFrom('attempts')
    .innerJoin('practice_set_learners as p', join => join.onRef('p.learner_id', '=', 'attempts.learner_id').on('p.set_id', '=', set.id))
    .select(eb => [
      'attempts.learner_id',
      eb.fn.countAll<number>().as('n'),
      eb.fn.sum<number>(eb.case().when('attempts.submitted_at', '>=', eb.ref('p.sent_at')).then(1).else(0).end()).as('after'),
    ])
    .groupBy('attempts.learner_id').execute()
  let slipQ = db.selectFrom('attempt_slips')
    .innerJoin('practice_set_learners as p', join => join.onRef('p.learner_id', '=', 'attempt_slips.learner_id').on('p.set_id', '=', set.id))
    .select(eb => [
      'attempt_slips.learner_id',
      eb.fn.count<number>('attempt_slips.attempt_id').distinct().as('n'),
      eb.fn.count<number>(eb.case().when('attempt_slips.created_at', '>=', eb.ref('p.sent_at')).then(eb.ref('attempt_slips.attempt_id')).end()).distinct().as('after'),
    ])
    .where('attempt_slips.code', 'in', [...slips])
  if (set.focus === 'left-right-rule-swapped' && set.eye) slipQ = slipQ.where('attempt_slips.eye', '=', set.eye)
  const slipped = await slipQ.groupBy('attempt_slips.learner_id').execute()
  const done = await db.selectFrom('cases')
    .innerJoin('attempts', 'attempts.case_id', 'cases.id')
    .select(eb => ['cases.owner_id', eb.fn.count<number>('cases.id').distinct().as('n')])
    .where('cases.practice_set_id', '=', set.id).where('cases.owner_id', 'in', ids)
    .groupBy('cases.owner_id').execute()

  const totals = { bA: 0, bS: 0, aA: 0, aS: 0 }
  const learners = recipients.map((r) => {
    const a = attempts.find(x => x.learner_id === r.id)
    const s = slipped.find(x => x.learner_id === r.id)
    const all = Number(a?.n ?? 0)
    const after = Number(a?.after ?? 0)
    const sAll = Number(s?.n ?? 0)
    const sAfter = Number(s?.after ?? 0)
    totals.bA += all - after
    totals.bS += sAll - sAfter
    totals.aA += after
    totals.aS += sAfter
    return {
      learner: { id: r.id, name: r.name },
      sentAt: r.sent_at,
      casesDone: Number(done.find(d => d.owner_id === r.id)?.n ?? 0),
      before: rate(sAll - sAfter, all - after),
      after: rate(sAfter, after),
    }
  })
  return { learners, before: rate(totals.bS, totals.bA), after: rate(totals.aS, totals.aA), slips }
}

export function focusDescription(focus: PatternCode, eye: Eye | null): string {
  return `${PATTERN_INFO[focus].title}${eye ? ` (${eye})` : ''}`
}
