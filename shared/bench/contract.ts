// The shapes the bench exchanges with whoever mounts it. The practice API's own
// types live in shared/types/practice.ts and shared/schemas/practice.ts; these are
// the bench's view of them, loose enough for a quiz to mount the bench too.

import type { BenchDraft, TurnRequestBody } from '../schemas/practice'
import type { AttemptResult } from '../types/practice'

export type { BenchDraft }

/** What the learner sends to have the virtual patient turn the rods. */
export type TurnRequest = TurnRequestBody

/** The attempt the bench submits: the draft, plus the trial read in patient-turns. */
export type AttemptBody = BenchDraft & { trial?: number }

/**
 * A graded attempt as the bench shows it: a practice result, or a quiz's, which may
 * come without the truth (held back until release) and without an id.
 */
export type BenchResult = Omit<AttemptResult, 'attemptId' | 'truth'> & {
  attemptId?: number
  truth?: AttemptResult['truth']
}
