// Per-learner pattern counts in SQL: slips are folded per attempt (which codes,
// which eyes reversed), then per learner. The rules that turn counts into
// patterns live in shared/review/patterns.ts, shared with the tests that run
// them on hand-made histories.
import { sql } from 'kysely'
import type { ExpressionBuilder, Kysely, RawBuilder } from 'kysely'
import type { Database } from '~~/db/schema'
import { isSlipCode } from '#shared/engine/slips'
import type { Eye } from '#shared/engine/types'
import { PATTERN_INFO, RECORDING_SLIPS, detectPatterns, emptyCounts, focusSlips, needsHelpScore } from '#shared/review/patterns'
import type { FoundPattern, LearnerCounts } from '#shared/review/patterns'
import type { ReviewFilters } from '#shared/schemas/review'
import type { LearnerRow } from '#shared/types/review'
import { attemptsPerLearner } from './aggregates'
import { applyReviewFilters } from './filters'
import type { ReviewScope } from './scope'

/**
 * LearnerCounts for every learner with attempts in the view (the eye filter does
 * not apply: patterns compare the eyes). Each query walks attempts_rv_learner or
 * attempt_slips_rv_learner grouped by cohort then learner, so nothing is sorted;
 * an attempt belongs to one cohort, so per-cohort counts add up exactly.
 */
export async function learnerCounts(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope, cohortsOf?: Map<number, Set<number>>): Promise<Map<number, LearnerCounts>> {
  const noEye = { ...f, eye: undefined }
  const slips = () => applyReviewFilters(db.selectFrom('attempt_slips'), 'attempt_slips', noEye, scope)
  const distinctAttempts = (eb: ExpressionBuilder<Database, 'attempt_slips'>) => eb.fn.count<number>('attempt_slips.attempt_id').distinct()
  const attempts = await attemptsPerLearner(db, noEye, scope, cohortsOf)
  const attemptIf = (cond: RawBuilder<unknown>) => sql`case when ${cond} then ${sql.ref('attempt_slips.attempt_id')} end`
  const eye = sql.ref('attempt_slips.eye')
  // one pass per learner and code: attempts with the code (the index keeps attempt ids
  // in order inside each group, so this distinct count needs no temporary table)
  const byCode = await slips()
    .select(eb => ['attempt_slips.cohort_id', 'attempt_slips.learner_id', 'attempt_slips.code', distinctAttempts(eb).as('n')])
    .groupBy(['attempt_slips.cohort_id', 'attempt_slips.learner_id', 'attempt_slips.code']).execute()
  // reversed directions only: which eyes, per attempt
  const reversed = await slips()
    .select(eb => [
      'attempt_slips.cohort_id', 'attempt_slips.learner_id', distinctAttempts(eb).as('eyed'),
      sql<number>`count(distinct ${attemptIf(sql`${eye} = 'RE'`)})`.as('re'),
      sql<number>`count(distinct ${attemptIf(sql`${eye} = 'LE'`)})`.as('le'),
    ])
    .where('attempt_slips.code', '=', 'direction-reversed').where('attempt_slips.eye', 'in', ['RE', 'LE'])
    .groupBy(['attempt_slips.cohort_id', 'attempt_slips.learner_id']).execute()
  // one pass per learner: attempts with any slip, and with any recording slip
  const any = await slips()
    .select(eb => [
      'attempt_slips.cohort_id', 'attempt_slips.learner_id', distinctAttempts(eb).as('n'),
      sql<number>`count(distinct ${attemptIf(sql`${sql.ref('attempt_slips.code')} in (${sql.join(RECORDING_SLIPS)})`)})`.as('rec'),
    ])
    .groupBy(['attempt_slips.cohort_id', 'attempt_slips.learner_id']).execute()

  const out = new Map<number, LearnerCounts>()
  for (const [id, n] of attempts) out.set(id, { ...emptyCounts(), attempts: n })
  const each = <R extends { learner_id: number }>(rows: R[], fn: (c: LearnerCounts, r: R) => void) => {
    for (const r of rows) {
      const c = out.get(r.learner_id)
      if (c) fn(c, r)
    }
  }
  each(byCode, (c, r) => {
    if (isSlipCode(r.code)) c.byCode[r.code] = (c.byCode[r.code] ?? 0) + Number(r.n)
  })
  each(reversed, (c, r) => {
    // attempts reversed in the right eye, the left, either: the rest is arithmetic
    const re = Number(r.re)
    const le = Number(r.le)
    const all = Number(r.eyed)
    c.reversed.reOnly += all - le
    c.reversed.leOnly += all - re
    c.reversed.both += re + le - all
  })
  each(any, (c, r) => {
    c.slipAttempts += Number(r.n)
    c.recordingAttempts += Number(r.rec)
  })
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
  const cohortsOf = new Map<number, Set<number>>()
  const counts = await learnerCounts(db, f, scope, cohortsOf)
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
    // naming the learners' cohorts lets SQLite use attempt_slips_rv_learner (cohort, learner, code), which covers this query
    ? await applyReviewFilters(db.selectFrom('attempt_slips'), 'attempt_slips', { ...f, eye: undefined }, { ...scope, cohortIds: [...new Set(top.flatMap(x => [...(cohortsOf.get(x.id) ?? [])]))] })
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
