// Random attempt histories for the slip-pattern rules: slips, and the truth and
// recorded directions that decide whether a one-eye reversal can tell a rule swap
// from recording the image (ruleSwapEvidence, shared/engine/slips.ts). Biased
// towards one-eye reversals beside a torted, rightly recorded fellow eye, so random
// samples exercise the rule swap and not only its absence.
import { fc } from '@fast-check/vitest'
import type { RuleSwapAttempt, Slip } from '../../shared/engine/slips'
import type { Eye } from '../../shared/engine/types'

export type Dir = 'excyclo' | 'incyclo' | 'none' | null
export interface HistoryAttempt extends RuleSwapAttempt {
  slips: Slip[]
  torsion: { RE: number, LE: number }
  recorded: { RE: Dir, LE: Dir }
}

/** The direction a true torsion has: 1° or more (domain.md §5.2). */
export const dirOf = (t: number): Dir => (Math.abs(t) < 1 ? 'none' : t > 0 ? 'excyclo' : 'incyclo')
const flip = (d: Dir): Dir => (d === 'excyclo' ? 'incyclo' : d === 'incyclo' ? 'excyclo' : d)

/** An attempt on a case with this torsion where the record reverses these eyes and gets the others right. */
export function attemptOn(torsion: { RE: number, LE: number }, reversed: Eye[], extra: Slip[] = []): HistoryAttempt {
  const rec = (e: Eye): Dir => (reversed.includes(e) ? flip(dirOf(torsion[e])) : dirOf(torsion[e]))
  return { slips: [...reversed.map(eye => ({ code: 'direction-reversed' as const, eye })), ...extra], torsion, recorded: { RE: rec('RE'), LE: rec('LE') } }
}

const torsionArb = fc.constantFrom(-8, -4, -1.2, -1, -0.6, 0, 0.4, 0.9, 1, 1.5, 3, 6)
const dirArb = fc.constantFrom<Dir>('excyclo', 'incyclo', 'none', null)
const eyeArb = fc.constantFrom<Eye>('RE', 'LE')

export function slipArb(codes: readonly Slip['code'][]) {
  return fc.record({ code: fc.constantFrom(...codes), eye: fc.option(eyeArb, { nil: undefined }) })
    .map(s => (s.eye ? { code: s.code, eye: s.eye } : { code: s.code }) as Slip)
}

/** One attempt: anything at all, or a one-eye reversal that is (or nearly is) rule-swap evidence. */
export function attemptArb(codes: readonly Slip['code'][]): fc.Arbitrary<HistoryAttempt> {
  const random = fc.record({
    slips: fc.array(slipArb(codes), { maxLength: 4 }),
    torsion: fc.record({ RE: torsionArb, LE: torsionArb }),
    recorded: fc.record({ RE: dirArb, LE: dirArb }),
  })
  const oneEye = fc.record({ eye: eyeArb, torsion: fc.record({ RE: torsionArb, LE: torsionArb }), extra: fc.array(slipArb(codes.filter(c => c !== 'direction-reversed')), { maxLength: 2 }) })
    .map(({ eye, torsion, extra }) => attemptOn(torsion, [eye], extra))
  return fc.oneof(random, oneEye, oneEye)
}

/**
 * A history with a habit eye: most attempts reverse that eye on its own (on any
 * case, telling or not), the rest are random — so some histories make a rule swap,
 * some only look like one, and some are vetoed by the other eye.
 */
export function historyArb(codes: readonly Slip['code'][], length: { minLength?: number, maxLength: number }): fc.Arbitrary<HistoryAttempt[]> {
  return eyeArb.chain(habit => fc.array(fc.oneof(
    attemptArb(codes),
    fc.record({ torsion: fc.record({ RE: torsionArb, LE: torsionArb }) }).map(({ torsion }) => attemptOn(torsion, [habit])),
    fc.record({ torsion: fc.record({ RE: torsionArb, LE: torsionArb }) }).map(({ torsion }) => attemptOn(torsion, [habit])),
  ), length))
}
