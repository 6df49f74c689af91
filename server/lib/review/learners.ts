// Per-learner pattern counts in SQL: one grouped pass over the attempts by
// cohort, learner and slip set (each attempt's distinct slips as one key,
// attempts.slip_set), folded per learner here. The rules that turn counts into
// patterns live in shared/review/patterns.ts, shared with the tests that run
// them on hand-made histories.
import { sql } from 'kysely'
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'
import type { Eye } from '#shared/engine/types'
import { PATTERN_INFO, detectPatterns, emptyCounts, focusSlips, needsHelpScore } from '#shared/review/patterns'
import type { FoundPattern, LearnerCounts } from '#shared/review/patterns'
import { addSlipSet } from '#shared/review/slip-set'
import type { ReviewFilters } from '#shared/schemas/review'
import type { LearnerRow } from '#shared/types/review'
import { applyReviewFilters } from './filters'
import { byCohortParts } from './scope'
import type { ReviewScope } from './scope'

/**
 * LearnerCounts for every learner with attempts in the view (the eye filter does
 * not apply: patterns compare the eyes), and the cohorts each learner's attempts
 * were in. One walk of attempts_rv_slip_set (0007) grouped in its own column order,
 * so nothing is sorted (with a date range too: see dateByIndex); an attempt belongs to one cohort, so per-cohort groups add
 * up exactly. A few dozen distinct keys make a few thousand groups at 200,000 attempts.
 */
export async function learnerCounts(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope, cohortsOf?: Map<number, Set<number>>): Promise<Map<number, LearnerCounts>> {
  // the slip sets, and the rule-swap evidence (0012): a second, small pass over the partial
  // index that holds only the telling attempts, grouped in its own order (cohort, learner,
  // eye); both are sent together, the slip sets in parts of the cohorts (byCohortParts)
  const [rows, swaps] = await Promise.all([
    byCohortParts(db, scope, part => applyReviewFilters(db.selectFrom('attempts'), 'attempts', { ...f, eye: undefined }, part, { dateByIndex: false })
      .select(eb => ['attempts.cohort_id', 'attempts.learner_id', 'attempts.slip_set', eb.fn.countAll<number>().as('n')])
      .groupBy(['attempts.cohort_id', 'attempts.learner_id', 'attempts.slip_set']).execute()),
    applyReviewFilters(db.selectFrom('attempts'), 'attempts', { ...f, eye: undefined }, scope, { dateByIndex: false })
      .select(eb => ['attempts.cohort_id', 'attempts.learner_id', 'attempts.rule_swap_eye', eb.fn.countAll<number>().as('n')])
      .where('attempts.rule_swap_eye', 'is not', null)
      .groupBy(['attempts.cohort_id', 'attempts.learner_id', 'attempts.rule_swap_eye']).execute(),
  ])
  const out = new Map<number, LearnerCounts>()
  for (const r of rows) {
    let c = out.get(r.learner_id)
    if (!c) out.set(r.learner_id, c = emptyCounts())
    addSlipSet(c, r.slip_set, Number(r.n))
    if (cohortsOf && r.cohort_id !== null) {
      const set = cohortsOf.get(r.learner_id) ?? new Set<number>()
      set.add(r.cohort_id)
      cohortsOf.set(r.learner_id, set)
    }
  }
  for (const r of swaps) {
    const c = out.get(r.learner_id)
    if (c && (r.rule_swap_eye === 'RE' || r.rule_swap_eye === 'LE')) c.ruleSwap[r.rule_swap_eye] += Number(r.n)
  }
  return out
}

const EXAMPLES = 3
/** Per-pattern subqueries per statement: SQLite allows 500 terms in a compound SELECT. */
const EVIDENCE_CHUNK = 100

/**
 * The newest attempts (at most EXAMPLES) that show each pattern, per learner: one
 * small subquery per learner and pattern — the learner's slips of the pattern's
 * codes (for the rule swap, on its eye) within the same filters, one row per attempt,
 * newest first — joined with UNION ALL. Each walks only that learner's entries in
 * attempt_slips_rv_learner (cohort, learner, code, …), which covers it, so nothing
 * is read for learners off the list and only the examples come back.
 */
async function patternExamples(db: Kysely<Database>, f: ReviewFilters, scope: ReviewScope, wanted: { id: number, cohorts: number[], pattern: FoundPattern }[]): Promise<Map<FoundPattern, number[]>> {
  // the chunks are sent together (on PostgreSQL, each on its own pooled connection)
  const statements: Promise<{ k: number, attempt_id: number, at: string }[]>[] = []
  for (let from = 0; from < wanted.length; from += EVIDENCE_CHUNK) {
    const parts = wanted.slice(from, from + EVIDENCE_CHUNK).map(({ id, cohorts, pattern }, i) => {
      if (pattern.code === 'left-right-rule-swapped') {
        // only the attempts that tell the swap from recording the image (attempts.rule_swap_eye,
        // 0012), newest first, read in order from the partial index attempts_rv_rule_swap
        const sub = applyReviewFilters(db.selectFrom('attempts'), 'attempts', { ...f, eye: undefined }, { ...scope, cohortIds: cohorts })
          .select([sql<number>`${from + i}`.as('k'), 'attempts.id as attempt_id', 'attempts.submitted_at as at'])
          .where('attempts.learner_id', '=', id)
          .where('attempts.rule_swap_eye', '=', pattern.eye!)
          .orderBy('attempts.submitted_at', 'desc').limit(EXAMPLES)
        return db.selectFrom(sub.as(`e${i}`)).select([`e${i}.k`, `e${i}.attempt_id`, `e${i}.at`])
      }
      // naming the learner's cohorts lets SQLite use attempt_slips_rv_learner, which leads with cohort_id
      const q = applyReviewFilters(db.selectFrom('attempt_slips'), 'attempt_slips', { ...f, eye: undefined }, { ...scope, cohortIds: cohorts })
        .select(eb => [sql<number>`${from + i}`.as('k'), 'attempt_slips.attempt_id', eb.fn.max('attempt_slips.created_at').as('at')])
        .where('attempt_slips.learner_id', '=', id)
        .where('attempt_slips.code', 'in', [...focusSlips(pattern.code)])
      // an attempt ranks by its newest matching slip (ties: the higher id), as when every slip was read newest first
      const sub = q.groupBy('attempt_slips.attempt_id').orderBy('at', 'desc').orderBy('attempt_slips.attempt_id', 'desc').limit(EXAMPLES)
      return db.selectFrom(sub.as(`e${i}`)).select([`e${i}.k`, `e${i}.attempt_id`, `e${i}.at`])
    })
    statements.push(parts.slice(1).reduce((all, q) => all.unionAll(q), parts[0]!).execute())
  }
  const found = (await Promise.all(statements)).flat()
  // a compound SELECT promises no row order: put each pattern's few rows back in order here
  found.sort((a, b) => a.k - b.k || (a.at < b.at ? 1 : a.at > b.at ? -1 : 0) || b.attempt_id - a.attempt_id)
  const out = new Map<FoundPattern, number[]>(wanted.map(w => [w.pattern, []]))
  for (const r of found) out.get(wanted[Number(r.k)]!.pattern)!.push(r.attempt_id)
  return out
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

  const wanted = top.flatMap(x => x.patterns.map(pattern => ({ id: x.id, cohorts: [...(cohortsOf.get(x.id) ?? [])], pattern })))
  const examples = await patternExamples(db, f, scope, wanted)

  const items: LearnerRow[] = top.map(({ id, c, patterns, score }) => ({
    learner: { id, name: who.get(id)!.name, cohort: who.get(id)!.cohort ?? null },
    attempts: c.attempts,
    slipAttempts: c.slipAttempts,
    reversed: c.reversed,
    ruleSwap: c.ruleSwap,
    score,
    patterns: patterns.map(p => ({
      code: p.code,
      title: PATTERN_INFO[p.code].title,
      ...(p.eye ? { eye: p.eye as Eye } : {}),
      count: p.count,
      of: p.of,
      examples: examples.get(p) ?? [],
    })),
  }))
  return { items, total: ranked.length, learnersSeen: who.size }
}
