// Per-learner slip patterns (issue 6, item 2): habits that show over a learner's
// attempts rather than on one. The counts come from SQL on the server
// (server/lib/review/learners.ts) or from a plain history here; the same
// rules then decide which patterns a learner shows. Thresholds are Cyclodial's
// own teaching choices, not published figures.
import type { RuleSwapAttempt, SlipCode } from '#shared/engine/slips'
import { ruleSwapEvidence } from '#shared/engine/slips'
import type { Eye } from '#shared/engine/types'

export const PATTERN_CODES = [
  'image-recorded',
  'left-right-rule-swapped',
  'dial-value-as-amount',
  'test-unnamed',
  'measures-not-records',
  'records-not-measures',
] as const
export type PatternCode = (typeof PATTERN_CODES)[number]
export const isPatternCode = (v: unknown): v is PatternCode => typeof v === 'string' && (PATTERN_CODES as readonly string[]).includes(v)

/** Slips about what was written (with error carried forward, a bad reading is not one of these). */
export const RECORDING_SLIPS: readonly SlipCode[] = [
  'direction-reversed', 'dial-value-as-amount', 'amount-off', 'eye-wrong', 'eye-missing', 'amount-missing', 'direction-missing',
]
/** Slips about the measurement itself. */
export const MEASURING_SLIPS: readonly SlipCode[] = ['not-parallel']

export const PATTERN_INFO: Record<PatternCode, { title: string, summary: string, weight: number }> = {
  'image-recorded': {
    title: 'Reverses the direction (records the image)',
    summary: 'Excyclo and incyclo come out the wrong way round: most likely recording the tilt of the image, not the position of the eye. A reversal on a case where only one eye is torted counts here: it cannot tell this habit from using one eye\'s rule on the other.',
    weight: 10,
  },
  'left-right-rule-swapped': {
    title: 'Reverses the direction in one eye only',
    summary: 'The direction is wrong for one eye while the other eye\'s torsion is recorded the right way: the right eye\'s reading rule used on the left eye, or the reverse.',
    weight: 10,
  },
  'dial-value-as-amount': {
    title: 'Writes dial figures as amounts',
    summary: 'The amount written is the figure on the dial (e.g. 100°), not the change from 90°.',
    weight: 5,
  },
  'test-unnamed': {
    title: 'Names no test',
    summary: 'Records leave out the test (double Maddox rod).',
    weight: 1,
  },
  'measures-not-records': {
    title: 'Measures badly, records correctly',
    summary: 'Dial settings are often not where the lines look level, but what is written follows correctly from them.',
    weight: 2,
  },
  'records-not-measures': {
    title: 'Measures well, records badly',
    summary: 'Dial settings are right, but the written record often does not follow from them.',
    weight: 3,
  },
}

/** At least this many attempts show a pattern before it is reported (findRuleSwap's default too). */
export const PATTERN_MINIMUM = 2
/** …and (except the rule swap, which is findRuleSwap's rule) in at least this share of the attempts. */
export const PATTERN_SHARE = 0.2
/** "Records correctly" / "measures well": that kind of slip in at most this share of attempts. */
export const CLEAN_SHARE = 0.1

/** What the pattern rules need to know about one learner's attempts. */
export interface LearnerCounts {
  attempts: number
  /** Attempts with at least one slip of any code. */
  slipAttempts: number
  /** Attempts with at least one slip of each code. */
  byCode: Partial<Record<SlipCode, number>>
  /** Attempts with any recording slip. */
  recordingAttempts: number
  /** Attempts whose direction was reversed in the right eye only, the left only, or both. */
  reversed: { reOnly: number, leOnly: number, both: number }
  /**
   * One-eye reversals that tell a rule swap from recording the image: that eye
   * reversed while the other eye, torted by 1° or more, was recorded the right way
   * (ruleSwapEvidence; stored per attempt as attempts.rule_swap_eye, migration 0012).
   */
  ruleSwap: { RE: number, LE: number }
}

export interface FoundPattern {
  code: PatternCode
  eye?: Eye
  /** Attempts that show it. */
  count: number
  /** Attempts considered. */
  of: number
}

export function emptyCounts(): LearnerCounts {
  return { attempts: 0, slipAttempts: 0, byCode: {}, recordingAttempts: 0, reversed: { reOnly: 0, leOnly: 0, both: 0 }, ruleSwap: { RE: 0, LE: 0 } }
}

/** The counts for a plain history (what the SQL computes for stored attempts). */
export function countsFromHistory(history: ReadonlyArray<RuleSwapAttempt>): LearnerCounts {
  const c = emptyCounts()
  for (const a of history) {
    c.attempts += 1
    const codes = new Set(a.slips.map(s => s.code))
    if (codes.size) c.slipAttempts += 1
    for (const code of codes) c.byCode[code] = (c.byCode[code] ?? 0) + 1
    if ([...codes].some(code => RECORDING_SLIPS.includes(code))) c.recordingAttempts += 1
    const rev = new Set(a.slips.filter(s => s.code === 'direction-reversed' && s.eye).map(s => s.eye!))
    if (rev.has('RE') && rev.has('LE')) c.reversed.both += 1
    else if (rev.has('RE')) c.reversed.reOnly += 1
    else if (rev.has('LE')) c.reversed.leOnly += 1
    const swapped = ruleSwapEvidence(a)
    if (swapped) c.ruleSwap[swapped] += 1
  }
  return c
}

/**
 * findRuleSwap (shared/engine/slips.ts) restated on counts: at least `minimum`
 * attempts that tell a swap on one eye from recording the image, and the other eye
 * never reversed on its own. Attempts that reverse both eyes count for neither.
 */
export function ruleSwapEye(c: Pick<LearnerCounts, 'reversed' | 'ruleSwap'>, minimum = PATTERN_MINIMUM): Eye | null {
  if (c.ruleSwap.RE >= minimum && c.reversed.leOnly === 0) return 'RE'
  if (c.ruleSwap.LE >= minimum && c.reversed.reOnly === 0) return 'LE'
  return null
}

const share = (n: number, of: number): number => (of === 0 ? 0 : n / of)
const habit = (n: number, of: number): boolean => n >= PATTERN_MINIMUM && share(n, of) >= PATTERN_SHARE

/** The patterns one learner's counts show, most telling first. Clean histories show none. */
export function detectPatterns(c: LearnerCounts): FoundPattern[] {
  const found: FoundPattern[] = []
  const of = c.attempts
  const swap = ruleSwapEye(c)
  const { reOnly, leOnly, both } = c.reversed
  const reversedAttempts = reOnly + leOnly + both
  if (swap) found.push({ code: 'left-right-rule-swapped', eye: swap, count: c.ruleSwap[swap], of })
  // every other reversal, one-eye ones that cannot tell a swap apart included, is recording the image
  else if (habit(reversedAttempts, of)) found.push({ code: 'image-recorded', count: reversedAttempts, of })
  const dial = c.byCode['dial-value-as-amount'] ?? 0
  if (habit(dial, of)) found.push({ code: 'dial-value-as-amount', count: dial, of })
  const measuring = MEASURING_SLIPS.reduce((n, code) => Math.max(n, c.byCode[code] ?? 0), 0)
  const specificRecording = found.length > 0
  if (habit(measuring, of) && share(c.recordingAttempts, of) <= CLEAN_SHARE) {
    found.push({ code: 'measures-not-records', count: measuring, of })
  }
  // a more specific recording habit above already explains a poor record
  if (!specificRecording && habit(c.recordingAttempts, of) && share(measuring, of) <= CLEAN_SHARE) {
    found.push({ code: 'records-not-measures', count: c.recordingAttempts, of })
  }
  const unnamed = c.byCode['test-unnamed'] ?? 0
  if (habit(unnamed, of)) found.push({ code: 'test-unnamed', count: unnamed, of })
  return found
}

/**
 * Rank for the "needs help" list: attempts showing a pattern, weighted so that sign
 * errors (a reversed direction changes the diagnosis) come before incomplete records.
 */
export const needsHelpScore = (patterns: readonly FoundPattern[]): number =>
  patterns.reduce((sum, p) => sum + PATTERN_INFO[p.code].weight * p.count, 0)

/** The slips whose rate a practice set for this pattern should bring down. */
export function focusSlips(code: PatternCode): readonly SlipCode[] {
  switch (code) {
    case 'image-recorded':
    case 'left-right-rule-swapped':
      return ['direction-reversed']
    case 'dial-value-as-amount':
      return ['dial-value-as-amount']
    case 'test-unnamed':
      return ['test-unnamed']
    case 'measures-not-records':
      return MEASURING_SLIPS
    case 'records-not-measures':
      return RECORDING_SLIPS
  }
}
