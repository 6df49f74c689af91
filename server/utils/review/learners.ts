// Per-learner pattern counts in SQL: slips are folded per attempt (which codes,
// which eyes reversed), then per learner. The rules that turn counts into
// patterns live in shared/review/patterns.ts, shared with the tests that run
// them on hand-made histories.
import { sql } from 'kysely'
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'
import { SLIP_CODES } from '#shared/engine/slips'
import type { Eye } from '#shared/engine/types'
import { PATTERN_INFO, RECORDING_SLIPS, detectPatterns, focusSlips, needsHelpScore } from '#shared/review/patterns'
import type { FoundPattern, LearnerCounts } from '#shared/review/patterns'
import type { ReviewFilters } from '#shared/schemas/review'
import type { LearnerRow } from '#shared/types/review'
import { applyReviewFilters } from './filters'
import type { ReviewScope } from './scope'

const flag = (cond: ReturnType<typeof sql>) => sql<number>`max(case when ${cond} then 1 else 0 end)`
const code = sql.ref('attempt_slips.code')
const eye = sql.ref('attempt_slips.eye')

/** LearnerCounts for every learner with attempts in the view (the eye filter does not apply: patterns compare the eyes). */
export async function learnerCounts(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope): Promise<Map<number, LearnerCounts>> {
  const noEye = { ...f, eye: undefined }
  const attempts = await applyReviewFilters(db.selectFrom('attempts'), 'attempts', noEye, scope)
    .select(eb => ['attempts.learner_id', eb.fn.countAll<number>().as('n')])
    .groupBy('attempts.learner_id').execute()

  const perAttempt = applyReviewFilters(db.selectFrom('attempt_slips'), 'attempt_slips', noEye, scope)
    .select([
      'attempt_slips.learner_id',
      flag(sql`${code} in (${sql.join(RECORDING_SLIPS)})`).as('rec'),
      flag(sql`${code} = 'direction-reversed' and ${eye} = 'RE'`).as('re_rev'),
      flag(sql`${code} = 'direction-reversed' and ${eye} = 'LE'`).as('le_rev'),
      ...SLIP_CODES.map(c => flag(sql`${code} = ${c}`).as(`c_${c}`)),
    ])
    .groupBy(['attempt_slips.learner_id', 'attempt_slips.attempt_id'])
  const perLearner = await db.selectFrom(perAttempt.as('a'))
    .select(eb => [
      'a.learner_id',
      eb.fn.countAll<number>().as('slip_attempts'),
      sql<number>`sum(a.rec)`.as('rec'),
      sql<number>`sum(case when a.re_rev = 1 and a.le_rev = 0 then 1 else 0 end)`.as('re_only'),
      sql<number>`sum(case when a.le_rev = 1 and a.re_rev = 0 then 1 else 0 end)`.as('le_only'),
      sql<number>`sum(case when a.re_rev = 1 and a.le_rev = 1 then 1 else 0 end)`.as('both'),
      ...SLIP_CODES.map(c => sql<number>`sum(${sql.ref(`a.c_${c}`)})`.as(`c_${c}`)),
    ])
    .groupBy('a.learner_id').execute() as unknown as Record<string, number>[]

  const out = new Map<number, LearnerCounts>()
  for (const r of attempts) {
    out.set(r.learner_id, { attempts: Number(r.n), slipAttempts: 0, byCode: {}, recordingAttempts: 0, reversed: { reOnly: 0, leOnly: 0, both: 0 } })
  }
  for (const r of perLearner) {
    const c = out.get(Number(r.learner_id))
    if (!c) continue
    c.slipAttempts = Number(r.slip_attempts)
    c.recordingAttempts = Number(r.rec)
    c.reversed = { reOnly: Number(r.re_only), leOnly: Number(r.le_only), both: Number(r.both) }
    for (const sc of SLIP_CODES) {
      const n = Number(r[`c_${sc}`] ?? 0)
      if (n) c.byCode[sc] = n
    }
  }
  return out
}

const EXAMPLES = 3

/** The slips that are evidence for a found pattern (for the rule swap, on its eye). */
function evidenceMatches(p: FoundPattern, slip: { code: string, eye: string | null }): boolean {
  if (!(focusSlips(p.code) as readonly string[]).includes(slip.code)) return false
  return p.code !== 'left-right-rule-swapped' || slip.eye === p.eye
}

/** The ranked "needs help" list: learners with at least one pattern, most help needed first. */
export async function needsHelp(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope, limit: number): Promise<{ items: LearnerRow[], total: number, learnersSeen: number }> {
  const counts = await learnerCounts(db, f, scope)
  const ids = [...counts.keys()]
  const people = ids.length
    ? await db.selectFrom('users')
        .leftJoin('cohort_members', 'cohort_members.user_id', 'users.id')
        .leftJoin('cohorts', 'cohorts.id', 'cohort_members.cohort_id')
        .select(['users.id', 'users.name', 'cohorts.name as cohort'])
        .where('users.role', '=', 'student').where('users.id', 'in', ids).execute()
    : []
  const who = new Map(people.map(p => [p.id, p]))
  const ranked = [...counts.entries()]
    .filter(([id]) => who.has(id))
    .map(([id, c]) => ({ id, c, patterns: detectPatterns(c) }))
    .filter(x => x.patterns.length > 0)
    .map(x => ({ ...x, score: needsHelpScore(x.patterns) }))
    .sort((a, b) => b.score - a.score || b.c.slipAttempts / b.c.attempts - a.c.slipAttempts / a.c.attempts || a.id - b.id)
  const top = ranked.slice(0, limit)

  const wanted = [...new Set(top.flatMap(x => x.patterns.flatMap(p => focusSlips(p.code))))]
  const evidence = top.length && wanted.length
    ? await applyReviewFilters(db.selectFrom('attempt_slips'), 'attempt_slips', { ...f, eye: undefined }, scope)
        .select(['attempt_slips.learner_id', 'attempt_slips.attempt_id', 'attempt_slips.code', 'attempt_slips.eye'])
        .where('attempt_slips.learner_id', 'in', top.map(x => x.id))
        .where('attempt_slips.code', 'in', wanted)
        .orderBy('attempt_slips.created_at', 'desc').orderBy('attempt_slips.attempt_id', 'desc').execute()
    : []

  const items: LearnerRow[] = top.map(({ id, c, patterns, score }) => {
    const mine = evidence.filter(e => e.learner_id === id)
    return {
      learner: { id, name: who.get(id)!.name, cohort: who.get(id)!.cohort ?? null },
      attempts: c.attempts,
      slipAttempts: c.slipAttempts,
      reversed: c.reversed,
      score,
      patterns: patterns.map(p => ({
        code: p.code,
        title: PATTERN_INFO[p.code].title,
        ...(p.eye ? { eye: p.eye as Eye } : {}),
        count: p.count,
        of: p.of,
        examples: [...new Set(mine.filter(e => evidenceMatches(p, e)).map(e => e.attempt_id))].slice(0, EXAMPLES),
      })),
    }
  })
  return { items, total: ranked.length, learnersSeen: who.size }
}
