// recordAttempt and the case-row helpers on a real (in-memory) SQLite database,
// migrated like the server's: the paths quizzes and the demo seed will use —
// kind 'quiz' with quiz ids and grading options, a hand-authored spec, an outer
// transaction, patient turns, back-dated times.
import type { Kysely } from 'kysely'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { migrateToLatest, openDatabase } from '~~/db/open'
import type { Database } from '~~/db/schema'
import { amountError, recordAttempt } from '~~/server/lib/practice/attempts'
import { CaseInputError, caseTurns, insertCase, recordTurn, regenerateCase } from '~~/server/lib/practice/cases'

let db: Kysely<Database>
let learnerId: number
let cohortId: number
const now = '2026-11-02T10:00:00.000Z'

// A tutor's exact case: RE 6° excyclo, LE none, in every position of gaze.
const SPEC = {
  label: 'Written exam case A',
  condition: 'so-palsy',
  affectedEye: 'RE',
  palsiedMuscles: ['RSO'],
  gazes: { primary: { torsion: { RE: 6, LE: 0 }, vertical: 6 } },
  response: { reliabilitySd: 1, parallelThreshold: 1 },
}

beforeEach(async () => {
  db = openDatabase(':memory:')
  await migrateToLatest(db)
  cohortId = (await db.insertInto('cohorts').values({ name: 'Test cohort', created_at: now, updated_at: now }).returning('id').executeTakeFirstOrThrow()).id
  learnerId = (await db.insertInto('users').values({ email: 's@t.test', name: 'S', role: 'student', password_hash: 'x', created_at: now, updated_at: now }).returning('id').executeTakeFirstOrThrow()).id
  await db.insertInto('cohort_members').values({ cohort_id: cohortId, user_id: learnerId, created_at: now }).execute()
})
afterEach(async () => {
  await db.destroy()
})

describe('recordAttempt', () => {
  it('stores a quiz attempt on a hand-authored case with the quiz\'s tolerance and weights', async () => {
    const { row } = await insertCase(db, { ownerId: learnerId, purpose: 'quiz', mode: 'learner-turns', spec: SPEC, quizId: 7, quizItemId: 3, now })
    expect(row).toMatchObject({ template_id: null, condition: 'so-palsy', difficulty: 'hand-authored', quiz_id: 7, quiz_item_id: 3 })
    const r = await recordAttempt(db, {
      caseRow: row,
      learnerId,
      kind: 'quiz',
      attempt: { gaze: 'primary', distance: 'near', readings: { RE: 96, LE: 90 }, record: 'DMR N PP: RE 9 ex, LE nil' },
      options: { tolerance: 1, weights: { amount: 10 } },
      startedAt: '2026-11-02T09:58:00.000Z',
      submittedAt: '2026-11-02T10:00:00.000Z',
    })
    // 9° against 6° is outside a 1° tolerance and outside twice it: no amount mark, weight 10
    const amount = r.grade.marks.find(m => m.criterion === 'amount')!
    expect(amount).toMatchObject({ score: 0, weight: 10 })
    expect(r.grade.slips.map(s => s.code)).toEqual(['amount-off'])

    const a = await db.selectFrom('attempts').selectAll().where('id', '=', r.attemptId).executeTakeFirstOrThrow()
    expect(a).toMatchObject({
      kind: 'quiz', quiz_id: 7, quiz_item_id: 3, cohort_id: cohortId, condition: 'so-palsy', template_id: null,
      difficulty: 'hand-authored', re_true_direction: 'excyclo', le_true_direction: 'none', re_recorded_direction: 'excyclo',
      le_recorded_direction: 'none', re_amount_error: 3, le_amount_error: 0, duration_ms: 120_000, submitted_at: '2026-11-02T10:00:00.000Z',
    })
    expect(a.points_possible).toBe(r.grade.points.possible)
    expect(JSON.parse(a.truth_json).label).toBe('Written exam case A')
    const slips = await db.selectFrom('attempt_slips').selectAll().where('attempt_id', '=', r.attemptId).execute()
    expect(slips).toEqual([expect.objectContaining({ code: 'amount-off', eye: 'RE', kind: 'quiz', quiz_id: 7, cohort_id: cohortId, condition: 'so-palsy', created_at: '2026-11-02T10:00:00.000Z' })])
  })

  it('writes inside the caller\'s transaction, so a rolled-back caller leaves nothing', async () => {
    const { row } = await insertCase(db, { ownerId: learnerId, purpose: 'practice', mode: 'learner-turns', templateId: 'so-palsy-right-standard', seed: 'tx' })
    await expect(db.transaction().execute(async (trx) => {
      await recordAttempt(trx, { caseRow: row, learnerId, kind: 'practice', attempt: { gaze: 'primary', distance: 'near', readings: { RE: 90, LE: 90 }, record: 'RE 5 in' } })
      throw new Error('caller fails after grading')
    })).rejects.toThrow('caller fails')
    expect(await db.selectFrom('attempts').select('id').execute()).toEqual([])
    expect(await db.selectFrom('attempt_slips').select('id').execute()).toEqual([])
  })

  it('patient turns: needs a stored turn, and grades against where the patient left the rods', async () => {
    const { row } = await insertCase(db, { ownerId: learnerId, purpose: 'practice', mode: 'patient-turns', templateId: 'io-palsy-left-standard', seed: 'pt' })
    const base = { caseRow: row, learnerId, kind: 'practice' as const }
    const attempt = { gaze: 'primary' as const, distance: 'near' as const, readings: { RE: 90, LE: 90 }, record: 'DMR N PP: nil' }
    await expect(recordAttempt(db, { ...base, attempt, trial: 1 })).rejects.toBeInstanceOf(CaseInputError)
    const turn = await recordTurn(db, { ...row }, { gaze: 'primary', distance: 'near' })
    expect(turn.trial).toBe(1)
    expect((await caseTurns(db, row.id)).map(t => t.result)).toEqual([turn])
    const r = await recordAttempt(db, { ...base, attempt: { ...attempt, readings: turn.readings }, trial: 1 })
    expect(r.grade.marks.find(m => m.criterion === 'measurement')?.score).toBe(1)
    expect(r.trial).toBe(1)
    // a student has no cohort → null; staff practising get null too
    const staff = (await db.insertInto('users').values({ email: 't@t.test', name: 'T', role: 'tutor', password_hash: 'x', created_at: now, updated_at: now }).returning('id').executeTakeFirstOrThrow()).id
    await db.insertInto('cohort_members').values({ cohort_id: cohortId, user_id: staff, created_at: now }).execute()
    const s = await recordAttempt(db, { ...base, learnerId: staff, attempt: { ...attempt, readings: turn.readings }, trial: 1 })
    expect((await db.selectFrom('attempts').select('cohort_id').where('id', '=', s.attemptId).executeTakeFirstOrThrow()).cohort_id).toBeNull()
  })

  it('refuses turns on a learner-turns case with a 409-kind error', async () => {
    const { row } = await insertCase(db, { ownerId: learnerId, purpose: 'practice', mode: 'learner-turns', templateId: 'normal-standard', seed: 'lt' })
    await expect(recordTurn(db, row, { gaze: 'primary', distance: 'near' })).rejects.toMatchObject({ status: 409, code: 'wrong-mode' })
  })
})

describe('case rows', () => {
  it('regenerates the same patient from a template row and from a spec row', async () => {
    const t = await insertCase(db, { ownerId: learnerId, purpose: 'practice', mode: 'learner-turns', templateId: 'skew-deviation-standard', seed: 'regen' })
    expect(regenerateCase(t.row)).toEqual(t.patient)
    const s = await insertCase(db, { ownerId: null, purpose: 'preview', mode: 'learner-turns', spec: SPEC })
    expect(regenerateCase(s.row)).toEqual(s.patient)
  })

  it('refuses an unknown template and an invalid spec naming the field', async () => {
    await expect(insertCase(db, { ownerId: learnerId, purpose: 'practice', mode: 'learner-turns', templateId: 'so-palsy-right', seed: 'x' })).rejects.toMatchObject({ field: 'template' })
    await expect(insertCase(db, { ownerId: learnerId, purpose: 'quiz', mode: 'learner-turns', spec: { ...SPEC, gazes: {} } })).rejects.toMatchObject({ field: expect.stringMatching(/^spec/) })
    expect(await db.selectFrom('cases').select('id').execute()).toEqual([])
  })
})

describe('amountError', () => {
  it('is recorded minus true magnitude; no torsion counts 0; missing is null', () => {
    expect(amountError({ amount: 8, direction: 'excyclo' }, 6)).toBe(2)
    expect(amountError({ amount: 4, direction: 'incyclo' }, -6.5)).toBe(-2.5)
    expect(amountError({ amount: null, direction: 'none' }, 3)).toBe(-3)
    expect(amountError({ amount: null, direction: 'excyclo' }, 3)).toBeNull()
    expect(amountError(undefined, 3)).toBeNull()
  })
})
