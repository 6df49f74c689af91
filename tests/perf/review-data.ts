// Bulk data for the review benchmark: learners with recording habits, and
// attempts whose content comes from the real engine. A pool of graded attempts
// per habit is made once, then each stored attempt copies one (new learner,
// cohort, date), so 200,000 rows take seconds and keep realistic slips, JSON
// sizes and direction/amount columns.
import type Database from 'better-sqlite3'
import { makeRng, pick } from '#shared/engine/random'
import type { Rng } from '#shared/engine/random'
import { EYES } from '#shared/engine/types'
import { ruleSwapEvidence } from '#shared/engine/slips'
import { slipSetOf } from '#shared/review/slip-set'
import type { Profile } from '../../db/seed/learner-model'
import { SIMULATION_TEMPLATES, simulateAttempt } from '../../db/seed/learner-model'
import { gradeAttempt } from '~~/server/lib/engine/attempt'
import { generateCase } from '~~/server/lib/engine/generator'

/** Share of learners with each habit (invented for the benchmark: most are clean). */
export const PROFILE_MIX: [Profile, number][] = [
  ['clean', 0.3], ['mostly-clean', 0.25], ['image', 0.1], ['swap-LE', 0.08], ['swap-RE', 0.04], ['dial', 0.08], ['unnamed', 0.08], ['measures-badly', 0.07],
]

export interface PooledAttempt {
  templateId: string
  condition: string
  gaze: string
  readings: string
  record: string
  parsed: string
  marks: string
  slipsJson: string
  truth: string
  score: number
  earned: number
  possible: number
  slips: { code: string, eye: string | null }[]
  /** attempts.slip_set, as recordAttempt writes it (0007). */
  slipSet: string
  /** attempts.rule_swap_eye, as recordAttempt writes it (0012). */
  ruleSwapEye: string | null
  dirs: { reTrue: string | null, reRec: string | null, leTrue: string | null, leRec: string | null }
  errors: { re: number | null, le: number | null }
}

export function gradedPool(profile: Profile, size: number): PooledAttempt[] {
  const rng = makeRng(`bench-pool-${profile}`)
  return Array.from({ length: size }, (_, i) => {
    const templateId = SIMULATION_TEMPLATES[i % SIMULATION_TEMPLATES.length]!
    const c = generateCase(templateId, `bench-${profile}-${i}`)
    const input = simulateAttempt(c, profile, rng)
    const g = gradeAttempt(c, input, { mode: 'learner-turns' })
    const rec = g.parsed.eyes
    const recordedDir = (e: 'RE' | 'LE') => rec[e]?.direction ?? null
    const recordedAmount = (e: 'RE' | 'LE') => (rec[e] ? (rec[e]!.direction === 'none' ? 0 : rec[e]!.amount) : null)
    const err = (e: 'RE' | 'LE') => {
      const a = recordedAmount(e)
      return a === null ? null : Math.round((a - Math.abs(g.truth.torsion[e])) * 10) / 10
    }
    const [re, le] = EYES.map(e => g.truth.directions[e])
    return {
      templateId,
      condition: c.condition,
      gaze: input.gaze,
      readings: JSON.stringify(input.readings),
      record: input.record,
      parsed: JSON.stringify(g.parsed),
      marks: JSON.stringify(g.marks),
      slipsJson: JSON.stringify(g.slips),
      truth: JSON.stringify(g.truth),
      score: g.score,
      earned: g.points.earned,
      possible: g.points.possible,
      slips: g.slips.map(s => ({ code: s.code, eye: s.eye ?? null })),
      slipSet: slipSetOf(g.slips),
      ruleSwapEye: ruleSwapEvidence({ slips: g.slips, torsion: g.truth.torsion, recorded: { RE: recordedDir('RE'), LE: recordedDir('LE') } }),
      dirs: { reTrue: re ?? null, reRec: recordedDir('RE'), leTrue: le ?? null, leRec: recordedDir('LE') },
      errors: { re: err('RE'), le: err('LE') },
    }
  })
}

function profileFor(rng: Rng): Profile {
  let x = rng()
  for (const [p, share] of PROFILE_MIX) {
    if ((x -= share) < 0) return p
  }
  return 'clean'
}

export interface BulkPlan { learners: number, attempts: number, cohorts: number, weeks: number, quizzesPerCohort: number, end: Date }

/** Writes cohorts, learners, one case and the attempts with their slips; returns what was made. */
export function writeBulk(sqlite: Database.Database, plan: BulkPlan) {
  const rng = makeRng('bench-bulk')
  const now = new Date().toISOString()
  const pools = new Map<Profile, PooledAttempt[]>()
  for (const [p] of PROFILE_MIX) pools.set(p, gradedPool(p, 240))

  const cohortIds: number[] = []
  const learners: { id: number, cohort: number, profile: Profile }[] = []
  const tx = sqlite.transaction(() => {
    const cohortStmt = sqlite.prepare('insert into cohorts (name, created_at, updated_at) values (?, ?, ?)')
    for (let c = 0; c < plan.cohorts; c++) cohortIds.push(Number(cohortStmt.run(`Bench cohort ${c + 1}`, now, now).lastInsertRowid))
    const userStmt = sqlite.prepare('insert into users (email, name, role, password_hash, disabled, created_at, updated_at) values (?, ?, \'student\', \'x\', 0, ?, ?)')
    const memberStmt = sqlite.prepare('insert into cohort_members (cohort_id, user_id, created_at) values (?, ?, ?)')
    for (let i = 0; i < plan.learners; i++) {
      const id = Number(userStmt.run(`bench.learner${i}@cyclodial.test`, `Bench Learner ${i + 1}`, now, now).lastInsertRowid)
      const cohort = cohortIds[i % cohortIds.length]!
      memberStmt.run(cohort, id, now)
      learners.push({ id, cohort, profile: profileFor(rng) })
    }
  })
  tx()
  const caseId = Number(sqlite.prepare(`insert into cases (owner_id, purpose, template_id, seed, generator_version, condition, difficulty, mode, created_at, updated_at)
    values (?, 'practice', 'so-palsy-left-standard', 'bench', 1, 'so-palsy', 'standard', 'learner-turns', ?, ?)`).run(learners[0]!.id, now, now).lastInsertRowid)

  const attemptStmt = sqlite.prepare(`insert into attempts (case_id, learner_id, cohort_id, kind, quiz_id, template_id, condition, difficulty, mode, seed, generator_version,
    gaze, distance, readings_json, prisms_json, lights, record_text, parsed_json, marks_json, score, points_earned, points_possible, slips_json, truth_json,
    re_true_direction, re_recorded_direction, le_true_direction, le_recorded_direction, re_amount_error, le_amount_error, submitted_at, slip_set, rule_swap_eye)
    values (?, ?, ?, ?, ?, ?, ?, 'standard', 'learner-turns', 'bench', 1, ?, 'near', ?, '[]', 'dim', ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`)
  const slipStmt = sqlite.prepare('insert into attempt_slips (attempt_id, learner_id, cohort_id, kind, quiz_id, template_id, condition, code, eye, created_at) values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)')
  const span = plan.weeks * 7 * 86_400_000
  let slipRows = 0
  const batch = 10_000
  for (let start = 0; start < plan.attempts; start += batch) {
    sqlite.transaction(() => {
      for (let i = start; i < Math.min(plan.attempts, start + batch); i++) {
        const l = learners[i % learners.length]!
        const a = pick(rng, pools.get(l.profile)!)
        const quiz = rng() < 0.2
        const quizId = quiz ? 1 + (cohortIds.indexOf(l.cohort) * plan.quizzesPerCohort) + Math.floor(rng() * plan.quizzesPerCohort) : null
        const at = new Date(plan.end.getTime() - Math.floor(rng() * span)).toISOString()
        const kind = quiz ? 'quiz' : 'practice'
        const id = Number(attemptStmt.run(caseId, l.id, l.cohort, kind, quizId, a.templateId, a.condition, a.gaze, a.readings, a.record, a.parsed, a.marks,
          a.score, a.earned, a.possible, a.slipsJson, a.truth, a.dirs.reTrue, a.dirs.reRec, a.dirs.leTrue, a.dirs.leRec, a.errors.re, a.errors.le, at, a.slipSet, a.ruleSwapEye).lastInsertRowid)
        for (const s of a.slips) {
          slipStmt.run(id, l.id, l.cohort, kind, quizId, a.templateId, a.condition, s.code, s.eye, at)
          slipRows++
        }
      }
    })()
  }
  return { cohortIds, learners, slipRows }
}

/** The cohorts of a benchmark file seeded earlier (REVIEW_BENCH_DB). */
export function reusedBulk(sqlite: Database.Database) {
  const cohortIds = (sqlite.prepare('select id from cohorts where name like \'Bench cohort %\' order by id').all() as { id: number }[]).map(r => r.id)
  const { n } = sqlite.prepare('select count(*) as n from attempt_slips').get() as { n: number }
  return { cohortIds, learners: [], slipRows: n }
}

/** Minimal client surface the PostgreSQL writer needs (a `pg` Client or pooled client). */
export interface PgQueryable { query: (text: string, values?: unknown[]) => Promise<{ rows: any[] }> }

/** The cohorts of a PostgreSQL benchmark database seeded earlier (REVIEW_BENCH_PG_DB). */
export async function reusedBulkPg(client: PgQueryable) {
  const cohortIds = (await client.query('select id from cohorts where name like \'Bench cohort %\' order by id')).rows.map(r => Number(r.id))
  const { n } = (await client.query('select count(*)::int as n from attempt_slips')).rows[0]
  return { cohortIds, learners: [], slipRows: Number(n) }
}

/**
 * Inserts rows with multi-row VALUES lists, as many rows per statement as fit under
 * PostgreSQL's 65,535 bind parameters (a limit of its wire protocol's Bind message,
 * postgresql.org/docs/current/protocol-message-formats.html: Int16 parameter count).
 */
async function insertMany(client: PgQueryable, table: string, columns: string[], rows: unknown[][]): Promise<void> {
  const perStatement = Math.max(1, Math.floor(60_000 / columns.length))
  for (let start = 0; start < rows.length; start += perStatement) {
    const chunk = rows.slice(start, start + perStatement)
    const values: unknown[] = []
    const tuples = chunk.map((row) => {
      const marks = row.map((v) => {
        values.push(v)
        return `$${values.length}`
      })
      return `(${marks.join(', ')})`
    })
    await client.query(`insert into ${table} (${columns.join(', ')}) values ${tuples.join(', ')}`, values)
  }
}

/**
 * The same bulk data as writeBulk (same random stream, so the same learners, habits,
 * dates and slips), written to a migrated PostgreSQL database in batched multi-row
 * inserts inside one transaction, then VACUUM ANALYZE so the planner has statistics
 * and the visibility map allows index-only scans, as after a normal autovacuum.
 */
export async function writeBulkPg(client: PgQueryable, plan: BulkPlan) {
  const rng = makeRng('bench-bulk')
  const now = new Date().toISOString()
  const pools = new Map<Profile, PooledAttempt[]>()
  for (const [p] of PROFILE_MIX) pools.set(p, gradedPool(p, 240))

  await client.query('begin')
  const cohortIds: number[] = []
  for (let c = 0; c < plan.cohorts; c++) {
    const r = await client.query('insert into cohorts (name, created_at, updated_at) values ($1, $2, $3) returning id', [`Bench cohort ${c + 1}`, now, now])
    cohortIds.push(Number(r.rows[0].id))
  }
  const learners: { id: number, cohort: number, profile: Profile }[] = []
  const userRows: unknown[][] = []
  for (let i = 0; i < plan.learners; i++) userRows.push([`bench.learner${i}@cyclodial.test`, `Bench Learner ${i + 1}`, 'student', 'x', 0, now, now])
  await insertMany(client, 'users', ['email', 'name', 'role', 'password_hash', 'disabled', 'created_at', 'updated_at'], userRows)
  const ids = new Map<string, number>((await client.query('select id, email from users where email like \'bench.learner%@cyclodial.test\'')).rows.map(r => [r.email as string, Number(r.id)]))
  const memberRows: unknown[][] = []
  for (let i = 0; i < plan.learners; i++) {
    const id = ids.get(`bench.learner${i}@cyclodial.test`)!
    const cohort = cohortIds[i % cohortIds.length]!
    memberRows.push([cohort, id, now])
    learners.push({ id, cohort, profile: profileFor(rng) })
  }
  await insertMany(client, 'cohort_members', ['cohort_id', 'user_id', 'created_at'], memberRows)
  const caseId = Number((await client.query(`insert into cases (owner_id, purpose, template_id, seed, generator_version, condition, difficulty, mode, created_at, updated_at)
    values ($1, 'practice', 'so-palsy-left-standard', 'bench', 1, 'so-palsy', 'standard', 'learner-turns', $2, $3) returning id`, [learners[0]!.id, now, now])).rows[0].id)

  const attemptCols = ['id', 'case_id', 'learner_id', 'cohort_id', 'kind', 'quiz_id', 'template_id', 'condition', 'difficulty', 'mode', 'seed', 'generator_version',
    'gaze', 'distance', 'readings_json', 'prisms_json', 'lights', 'record_text', 'parsed_json', 'marks_json', 'score', 'points_earned', 'points_possible', 'slips_json', 'truth_json',
    're_true_direction', 're_recorded_direction', 'le_true_direction', 'le_recorded_direction', 're_amount_error', 'le_amount_error', 'submitted_at', 'slip_set', 'rule_swap_eye']
  const slipCols = ['attempt_id', 'learner_id', 'cohort_id', 'kind', 'quiz_id', 'template_id', 'condition', 'code', 'eye', 'created_at']
  const { max } = (await client.query('select coalesce(max(id), 0) as max from attempts')).rows[0]
  let nextId = Number(max) + 1
  const span = plan.weeks * 7 * 86_400_000
  let slipRows = 0
  const batch = 10_000
  for (let start = 0; start < plan.attempts; start += batch) {
    const attempts: unknown[][] = []
    const slips: unknown[][] = []
    for (let i = start; i < Math.min(plan.attempts, start + batch); i++) {
      const l = learners[i % learners.length]!
      const a = pick(rng, pools.get(l.profile)!)
      const quiz = rng() < 0.2
      const quizId = quiz ? 1 + (cohortIds.indexOf(l.cohort) * plan.quizzesPerCohort) + Math.floor(rng() * plan.quizzesPerCohort) : null
      const at = new Date(plan.end.getTime() - Math.floor(rng() * span)).toISOString()
      const kind = quiz ? 'quiz' : 'practice'
      const id = nextId++
      attempts.push([id, caseId, l.id, l.cohort, kind, quizId, a.templateId, a.condition, 'standard', 'learner-turns', 'bench', 1, a.gaze, 'near', a.readings, '[]', 'dim', a.record, a.parsed, a.marks,
        a.score, a.earned, a.possible, a.slipsJson, a.truth, a.dirs.reTrue, a.dirs.reRec, a.dirs.leTrue, a.dirs.leRec, a.errors.re, a.errors.le, at, a.slipSet, a.ruleSwapEye])
      for (const s of a.slips) {
        slips.push([id, l.id, l.cohort, kind, quizId, a.templateId, a.condition, s.code, s.eye, at])
        slipRows++
      }
    }
    await insertMany(client, 'attempts', attemptCols, attempts)
    await insertMany(client, 'attempt_slips', slipCols, slips)
  }
  // the ids above were given explicitly: move the serial's sequence past them
  await client.query('select setval(pg_get_serial_sequence(\'attempts\', \'id\'), (select max(id) from attempts))')
  await client.query('commit')
  await client.query('vacuum analyze')
  return { cohortIds, learners, slipRows }
}
