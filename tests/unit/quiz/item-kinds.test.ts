// The registry of quiz item kinds (server/lib/quiz/item-kinds.ts): every kind a
// quiz item can have has one entry, with its routes and pages on disk, and each
// entry reads and marks its own tables — driven here on a real (in-memory) SQLite
// database migrated like the server's, with attempts written the way a sitting
// writes them (recordAttempt; the fundus grading's own result).
import { existsSync, readFileSync } from 'node:fs'
import type { Kysely } from 'kysely'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { KIND_CRITERIA, QUIZ_ITEM_KINDS } from '#shared/schemas/quiz'
import { migrateToLatest, openDatabase } from '~~/db/open'
import type { Database } from '~~/db/schema'
import type { CaseSpec } from '#shared/engine/case-spec'
import { recordAttempt } from '~~/server/lib/practice/attempts'
import { insertCase } from '~~/server/lib/practice/cases'
import { countingQuizAttempt } from '~~/server/lib/data/attempts'
import { insertMarkOverride } from '~~/server/lib/data/mark-overrides'
import { ITEM_KINDS, itemKind } from '~~/server/lib/quiz/item-kinds'
import type { DmrItemConfig, FundusItemConfig } from '~~/server/lib/quiz/items'
import { DEFAULT_QUIZ_WEIGHTS, resolveWeights } from '~~/server/lib/quiz/items'
import { fundusItemPictures, gradeFundusItem } from '~~/server/lib/quiz/fundus-item'

const now = '2026-11-02T10:00:00.000Z'
// A tutor's exact case: RE 6° excyclo, LE none, in every position of gaze.
const SPEC: CaseSpec = {
  label: 'Registry case',
  condition: 'so-palsy',
  affectedEye: 'RE',
  palsiedMuscles: ['RSO'],
  gazes: { primary: { torsion: { RE: 6, LE: 0 }, vertical: 6 } },
  response: { reliabilitySd: 1, parallelThreshold: 1 },
}
const dmrConfig: DmrItemConfig = {
  kind: 'dmr',
  source: { type: 'case', id: 1, spec: SPEC, title: 'Registry case' },
  perStudent: false,
  mode: 'learner-turns',
  readScale: false,
  tolerance: 1,
  weights: resolveWeights(undefined),
}
const fundusConfig: FundusItemConfig = {
  kind: 'fundus',
  // RE photograph: fovea 200 px temporal of and 25 px below the disc centre → atan(25/200) = 7.1° (arithmetic)
  source: { type: 'photo', id: 7, title: 'T', eye: 'RE', width: 640, height: 480, disc: { x: 430, y: 220 }, fovea: { x: 230, y: 245 }, angle: 7.1 },
  perStudent: false,
  tolerance: 1,
  weights: resolveWeights(undefined, DEFAULT_QUIZ_WEIGHTS, 'fundus'),
}

describe('the item-kind registry has one entry per kind', () => {
  it('names exactly the kinds a quiz item can have, each under its own name', () => {
    expect(Object.keys(ITEM_KINDS).sort()).toEqual([...QUIZ_ITEM_KINDS].sort())
    expect(Object.keys(KIND_CRITERIA).sort()).toEqual([...QUIZ_ITEM_KINDS].sort())
    for (const kind of QUIZ_ITEM_KINDS) expect(itemKind(kind).kind).toBe(kind)
  })

  it('gives every kind its own attempt table, override table, audit target and path', () => {
    for (const key of ['attemptTable', 'overrideTable', 'auditTarget', 'attemptPath'] as const) {
      const values = QUIZ_ITEM_KINDS.map(k => itemKind(k)[key])
      expect(new Set(values).size, key).toBe(QUIZ_ITEM_KINDS.length)
    }
  })

  it('has, for every kind, the two attempt routes calling its entry and the two attempt pages', () => {
    for (const kind of QUIZ_ITEM_KINDS) {
      const path = itemKind(kind).attemptPath
      for (const route of [`server/api/quizzes/[id]/${path}/[attemptId].get.ts`, `server/api/quizzes/[id]/${path}/[attemptId]/overrides.post.ts`]) {
        expect(existsSync(route), route).toBe(true)
        expect(readFileSync(route, 'utf8'), route).toContain(`ITEM_KINDS.${kind})`)
      }
      for (const page of [`pages/quizzes/[id]/${path}/[attemptId].vue`, `pages/student/quizzes/[id]/${path}/[attemptId].vue`]) {
        expect(existsSync(page), page).toBe(true)
      }
    }
  })
})

describe('each entry reads and marks its own tables', () => {
  let db: Kysely<Database>
  let student: number
  let other: number
  let tutor: number
  let quizId: number
  let dmrItem: number
  let fundusItem: number
  let caseId: number

  beforeEach(async () => {
    db = openDatabase(':memory:')
    await migrateToLatest(db)
    const user = async (email: string, role: 'student' | 'tutor') => (await db.insertInto('users').values({ email, name: email, role, password_hash: 'x', created_at: now, updated_at: now }).returning('id').executeTakeFirstOrThrow()).id
    student = await user('s@t.test', 'student')
    other = await user('o@t.test', 'student')
    tutor = await user('t@t.test', 'tutor')
    quizId = (await db.insertInto('quizzes').values({ owner_id: tutor, title: 'Q', seed: 'q1', time_limit_minutes: null, opens_at: null, closes_at: null, published_at: now, released_at: null, released_by: null, archived_at: null, duplicated_from: null, created_at: now, updated_at: now }).returning('id').executeTakeFirstOrThrow()).id
    const item = async (position: number, config: DmrItemConfig | FundusItemConfig) => (await db.insertInto('quiz_items').values({ quiz_id: quizId, position, kind: config.kind, config_json: JSON.stringify(config), created_at: now, updated_at: now }).returning('id').executeTakeFirstOrThrow()).id
    dmrItem = await item(1, dmrConfig)
    fundusItem = await item(2, fundusConfig)
    const { row } = await insertCase(db, { ownerId: student, purpose: 'quiz', mode: 'learner-turns', spec: SPEC, quizId, quizItemId: dmrItem, now })
    caseId = row.id
    // two submissions on the double Maddox rod item: the second (9° against 6°, outside twice the 1° tolerance) counts
    for (const record of ['DMR N PP: RE 6 ex, LE nil', 'DMR N PP: RE 9 ex, LE nil']) {
      await recordAttempt(db, { caseRow: row, learnerId: student, kind: 'quiz', attempt: { gaze: 'primary', distance: 'near', readings: { RE: 96, LE: 90 }, record }, options: { tolerance: 1 }, submittedAt: now })
    }
    // two submissions on the fundus item: atan(34/200) = 9.6°, 2.5° off the 7.1° reference (arithmetic), then on it
    const pictures = fundusItemPictures(fundusConfig, null)
    for (const fovea of [{ x: 230, y: 254 }, { x: 230, y: 245 }]) {
      const marks = { RE: { disc: { x: 430, y: 220 }, fovea, finding: 'within-normal' as const } }
      const result = gradeFundusItem(fundusConfig, pictures, marks)
      await db.insertInto('fundus_attempts').values({ learner_id: student, cohort_id: null, kind: 'quiz', case_id: null, photo_id: null, quiz_id: quizId, quiz_item_id: fundusItem, fundus_version: null, marks_json: JSON.stringify(marks), result_json: JSON.stringify(result), score: result.score, re_angle: result.eyes.RE?.measuredAngle ?? null, le_angle: null, submitted_at: now }).execute()
    }
  })
  afterEach(async () => {
    await db.destroy()
  })

  const configOf = { dmr: dmrConfig, fundus: fundusConfig }
  const itemOf = () => ({ dmr: dmrItem, fundus: fundusItem })

  for (const kind of QUIZ_ITEM_KINDS) {
    it(`${kind}: finds its attempts, the one that counts, its overrides and its drafts`, async () => {
      const entry = itemKind(kind)
      const attempts = await entry.attempts(db, quizId)
      expect(attempts.map(a => a.quiz_item_id)).toEqual([itemOf()[kind], itemOf()[kind]])
      expect(attempts[0]!.id).toBeLessThan(attempts[1]!.id)
      expect(await entry.attempts(db, quizId, other)).toEqual([])
      const last = attempts[1]!
      expect((await countingQuizAttempt(db, entry.attemptTable, { quizId, itemId: itemOf()[kind], learnerId: student })).id).toBe(last.id)
      expect((await entry.attempt(db, { quizId, attemptId: last.id }))?.id).toBe(last.id)
      expect((await entry.attempt(db, { quizId, attemptId: last.id, learnerId: student }))?.id).toBe(last.id)
      // another student asking, or another quiz: not found
      expect(await entry.attempt(db, { quizId, attemptId: last.id, learnerId: other })).toBeUndefined()
      expect(await entry.attempt(db, { quizId: quizId + 1, attemptId: last.id })).toBeUndefined()

      const criterion = KIND_CRITERIA[kind][0]!
      await insertMarkOverride(db, entry.overrideTable, last.id, { quiz_id: quizId, criterion, previous_score: 0, score: 0.75, reason: 'Seen on the bench.', actor_id: tutor, created_at: now })
      const overrides = await entry.overrides(db, quizId)
      expect(overrides).toEqual([expect.objectContaining({ attempt_id: last.id, criterion, score: 0.75, actorName: 't@t.test' })])
      // the other kind's table is untouched
      for (const k of QUIZ_ITEM_KINDS.filter(k => k !== kind)) expect(await itemKind(k).overrides(db, quizId)).toEqual([])
      const marks = entry.marks(last, configOf[kind], false, overrides)
      expect(marks.find(m => m.criterion === criterion)).toMatchObject({ score: 0.75, override: { reason: 'Seen on the bench.' } })
      expect(marks.every(m => KIND_CRITERIA[kind].includes(m.criterion))).toBe(true)

      expect(await entry.drafts(db, quizId)).toEqual([])
      if (kind === 'dmr') await db.updateTable('cases').set({ draft_json: '{}' }).where('id', '=', caseId).execute()
      else await db.insertInto('quiz_fundus_drafts').values({ quiz_item_id: fundusItem, student_id: student, quiz_id: quizId, draft_json: '{}', saved_at: now }).execute()
      expect(await entry.drafts(db, quizId)).toEqual([{ owner_id: student, quiz_item_id: itemOf()[kind] }])
      expect(await entry.drafts(db, quizId, other)).toEqual([])
    })
  }

  it('dmr: the record\'s slips count; the interpretation weight only when the quiz asks for it', async () => {
    const [, last] = await ITEM_KINDS.dmr.attempts(db, quizId)
    expect(ITEM_KINDS.dmr.slips(last!)).toEqual(['amount-off'])
    const w = dmrConfig.weights
    expect(ITEM_KINDS.dmr.nominalPossible(dmrConfig, false)).toBe(w.measurement + w.direction + w.amount + w.eye + w.test + w.gaze + w.distance)
    expect(ITEM_KINDS.dmr.nominalPossible(dmrConfig, true) - ITEM_KINDS.dmr.nominalPossible(dmrConfig, false)).toBe(w.interpretation)
    expect(ITEM_KINDS.dmr.criterionProblem('fundusAngle')).toBeNull()
  })

  it('fundus: no slips; angle and finding marks; another kind\'s criterion is refused before the marks', async () => {
    const [first, last] = await ITEM_KINDS.fundus.attempts(db, quizId)
    expect(ITEM_KINDS.fundus.slips(last!)).toEqual([])
    // 2.5° off with a 1° tolerance → 0 for the angle; then on the reference → 1
    expect(ITEM_KINDS.fundus.marks(first!, fundusConfig, false, []).map(m => [m.criterion, m.score])).toEqual([['fundusAngle', 0], ['fundusFinding', 1]])
    expect(ITEM_KINDS.fundus.marks(last!, fundusConfig, false, []).map(m => [m.criterion, m.score])).toEqual([['fundusAngle', 1], ['fundusFinding', 1]])
    expect(ITEM_KINDS.fundus.nominalPossible(fundusConfig, true)).toBe(fundusConfig.weights.fundusAngle + fundusConfig.weights.fundusFinding)
    expect(ITEM_KINDS.fundus.criterionProblem('amount')).toMatch(/fundusAngle and fundusFinding; it has no “amount” mark/)
    expect(ITEM_KINDS.fundus.criterionProblem('fundusFinding')).toBeNull()
  })
})
