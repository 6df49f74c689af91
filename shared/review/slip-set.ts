// An attempt's slips as one short text key, stored beside the attempt
// (attempts.slip_set, migration 0007) so the per-learner counts are one grouped
// pass over the attempts instead of several passes over their slips.
//
// The key is the attempt's distinct slips, each written `code` or `code:EYE`,
// sorted and joined by single spaces ('' for a clean attempt). Migration 0007
// backfills existing attempts with its own frozen copy of this rule: change the
// format only with a new migration that rewrites the column.
import { RECORDING_SLIPS } from './patterns'
import type { LearnerCounts } from './patterns'
import { isSlipCode } from '#shared/engine/slips'

export interface SlipLike { code: string, eye?: string | null }

const token = (s: SlipLike): string => (s.eye ? `${s.code}:${s.eye}` : s.code)

/** The key for an attempt's slips (order and repeats do not matter). */
export function slipSetOf(slips: readonly SlipLike[]): string {
  return [...new Set(slips.map(token))].sort().join(' ')
}

/** The slips a key stands for, one per distinct code and eye. */
export function slipsOfSet(set: string): SlipLike[] {
  if (!set) return []
  return set.split(' ').map((t) => {
    const at = t.indexOf(':')
    return at < 0 ? { code: t } : { code: t.slice(0, at), eye: t.slice(at + 1) }
  })
}

/**
 * Adds `n` attempts that share one key to a learner's counts: what
 * countsFromHistory (shared/review/patterns.ts) would add for each of them, but for
 * the rule-swap evidence, which the SQL counts from attempts.rule_swap_eye (0012).
 * tests/unit/review/sql.test.ts checks the two agree on random histories.
 */
export function addSlipSet(c: LearnerCounts, set: string, n: number): void {
  const slips = slipsOfSet(set)
  c.attempts += n
  if (!slips.length) return
  c.slipAttempts += n
  const codes = new Set(slips.map(s => s.code))
  for (const code of codes) if (isSlipCode(code)) c.byCode[code] = (c.byCode[code] ?? 0) + n
  if (slips.some(s => (RECORDING_SLIPS as readonly string[]).includes(s.code))) c.recordingAttempts += n
  const reversed = new Set(slips.filter(s => s.code === 'direction-reversed').map(s => s.eye))
  if (reversed.has('RE') && reversed.has('LE')) c.reversed.both += n
  else if (reversed.has('RE')) c.reversed.reOnly += n
  else if (reversed.has('LE')) c.reversed.leOnly += n
}
