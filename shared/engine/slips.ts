// Slip codes (domain.md §5.3). The codes are stable: they are stored with every
// attempt and counted on the slip-patterns page, so never rename one.

import type { Eye } from './types'

export const SLIP_CODES = [
  'direction-reversed',
  'left-right-rule-swapped',
  'dial-value-as-amount',
  'amount-off',
  'eye-wrong',
  'not-parallel',
  'test-unnamed',
  'eye-missing',
  'amount-missing',
  'direction-missing',
  'gaze-missing',
  'should-not-test',
] as const
export type SlipCode = (typeof SLIP_CODES)[number]

/** One slip on an attempt; `eye` says which eye it concerns when it concerns one. */
export interface Slip {
  code: SlipCode
  eye?: Eye
  /** A short, specific note for this attempt (e.g. "wrote 100°, the dial figure"). */
  detail?: string
}

export interface SlipInfo {
  title: string
  /** Plain-English explanation for learners (British English). */
  explanation: string
}

export const SLIP_INFO: Record<SlipCode, SlipInfo> = {
  'direction-reversed': {
    title: 'Direction reversed',
    explanation:
      'You recorded excyclo where the eye is incyclotorted, or the other way round. Record the position of the eye, not the tilt of the image: the patient turns the rod the same way as the eye is torted. Upper end of the rod axis towards the ear means excyclo; towards the nose means incyclo.',
  },
  'left-right-rule-swapped': {
    title: 'Right-eye rule used on the left eye (or the reverse)',
    explanation:
      'Across your attempts the direction comes out wrong for one eye only. On the shared dial a reading above 90° is excyclo for the right eye but incyclo for the left eye. Check each eye against the rule: right eye, torsion = reading − 90; left eye, torsion = 90 − reading.',
  },
  'dial-value-as-amount': {
    title: 'Dial figure written as the amount',
    explanation:
      'The amount is how far the rod was turned from 90°, not the figure on the dial. A right-eye reading of 100° is 10° of excyclotorsion, not 100°.',
  },
  'amount-off': {
    title: 'Amount outside tolerance',
    explanation:
      'The number of degrees is further from the finding than the tolerance allows. Re-check where the patient called the line level and the conversion from the dial.',
  },
  'eye-wrong': {
    title: 'Torsion given to the wrong eye',
    explanation:
      'The torsion belongs to the other eye. Note which rod is before which eye (the red rod is usually before the right eye) and which line the patient says is tilted.',
  },
  'not-parallel': {
    title: 'Dial not set where the lines look level',
    explanation:
      'Your dial reading is not where the patient sees that eye\'s line level. Turn the rod slowly until the patient says the line is level, and bracket from both sides.',
  },
  'test-unnamed': {
    title: 'Test not named',
    explanation: 'Name the test in the record: double Maddox rod (DMR).',
  },
  'eye-missing': {
    title: 'Eye not stated',
    explanation: 'Say which eye each finding belongs to: RE or LE.',
  },
  'amount-missing': {
    title: 'Amount missing',
    explanation: 'Give the amount in degrees for each eye, or write "no torsion".',
  },
  'direction-missing': {
    title: 'Direction missing',
    explanation: 'Say whether each eye is excyclotorted or incyclotorted.',
  },
  'gaze-missing': {
    title: 'Position of gaze missing',
    explanation: 'Say in which position of gaze you measured (for example primary position or 20° downgaze).',
  },
  'should-not-test': {
    title: 'Tested when the test could not be valid',
    explanation:
      'This patient cannot see both lines (suppression or abnormal retinal correspondence), so a double Maddox rod result would mislead. Stop, and record why the test was not performed.',
  },
}

/** Explanations whose example belongs to one eye, told with that eye's own example. */
const LEFT_EYE_EXPLANATION: Partial<Record<SlipCode, string>> = {
  'dial-value-as-amount':
    'The amount is how far the rod was turned from 90°, not the figure on the dial. A left-eye reading of 80° is 10° of excyclotorsion, not 80°.',
}

/** The plain-words explanation of a slip, with an example for the eye it concerns. */
export function slipExplanation(code: SlipCode, eye?: Eye): string {
  return (eye === 'LE' ? LEFT_EYE_EXPLANATION[code] : undefined) ?? SLIP_INFO[code].explanation
}

export const slipTitle = (code: SlipCode): string => SLIP_INFO[code].title
export const isSlipCode = (v: unknown): v is SlipCode => typeof v === 'string' && (SLIP_CODES as readonly string[]).includes(v)

/** A true torsion of at least this many degrees has a direction (domain.md §5.2, signed findings). */
export const DIRECTION_FROM_DEGREES = 1

/** What an attempt tells about the rule swap: its slips, and (to tell a swap from recording the image) its truth and record. */
export interface RuleSwapAttempt {
  slips: readonly Slip[]
  /** Signed true torsion per eye in the tested gaze, degrees, + = excyclo (what the double Maddox rod shows). */
  torsion?: Partial<Record<Eye, number>> | null
  /** The direction the record gives each eye: 'excyclo', 'incyclo', 'none', or null when the eye is not recorded. */
  recorded?: Partial<Record<Eye, string | null>> | null
}

/**
 * The eye an attempt shows being read with the other eye's rule, or null. A
 * direction reversed in one eye only can mean either habit: using one eye's rule on
 * the other, or recording the image where only that eye is torted. Only an attempt
 * where the OTHER eye had a true torsion of 1° or more and was recorded with the right
 * direction tells them apart (someone recording the image would have reversed it too),
 * so only such an attempt is evidence of a rule swap (domain.md §5.3).
 */
export function ruleSwapEvidence(a: RuleSwapAttempt): Eye | null {
  const reversed = new Set(a.slips.filter(s => s.code === 'direction-reversed' && s.eye).map(s => s.eye!))
  if (reversed.size !== 1 || !a.torsion || !a.recorded) return null
  const eye = [...reversed][0]!
  const other: Eye = eye === 'RE' ? 'LE' : 'RE'
  const t = a.torsion[other]
  if (typeof t !== 'number' || Math.abs(t) < DIRECTION_FROM_DEGREES) return null
  return a.recorded[other] === (t > 0 ? 'excyclo' : 'incyclo') ? eye : null
}

/**
 * `left-right-rule-swapped` is a pattern over a learner's attempts: at least
 * `minimum` attempts that are evidence for one eye (ruleSwapEvidence: that eye
 * reversed while the other eye's true torsion was recorded the right way), and no
 * attempt reversing the other eye on its own. Returns the eye whose rule is being
 * misapplied. One-eye reversals that cannot tell the habits apart never make it:
 * they count towards recording the image (shared/review/patterns.ts).
 */
export function findRuleSwap(
  attempts: ReadonlyArray<RuleSwapAttempt>,
  minimum = 2,
): Slip | null {
  const evidence: Record<Eye, number> = { RE: 0, LE: 0 }
  const oneEye: Record<Eye, number> = { RE: 0, LE: 0 }
  for (const a of attempts) {
    const reversed = new Set(a.slips.filter(s => s.code === 'direction-reversed' && s.eye).map(s => s.eye!))
    if (reversed.size === 1) oneEye[[...reversed][0]!] += 1
    const e = ruleSwapEvidence(a)
    if (e) evidence[e] += 1
  }
  const candidates = (['RE', 'LE'] as const).filter(e => evidence[e] >= minimum)
  if (candidates.length !== 1) return null
  const eye = candidates[0]!
  const other = eye === 'RE' ? 'LE' : 'RE'
  if (oneEye[other] > 0) return null
  return {
    code: 'left-right-rule-swapped',
    eye,
    detail: `direction reversed for the ${eye === 'RE' ? 'right' : 'left'} eye only in ${evidence[eye]} attempts where the ${other === 'RE' ? 'right' : 'left'} eye's torsion was recorded the right way`,
  }
}
