// The Parks three-step test (Parks, Arch Ophthalmol 1958; domain.md §7): which eye
// is higher in primary position, whether it is worse in right or left gaze and on
// right or left head tilt → one of eight muscles. It assumes a single palsied
// muscle and does not apply to restrictive thyroid eye disease or skew deviation.

import type { InterpretationBody } from '#shared/engine/schemas'
import type { Eye, Muscle, Side } from '#shared/engine/types'
import type { Case } from './types'

export interface ThreeStepAnswer {
  higherEye: Eye
  worseGaze: Side
  worseTilt: Side
}

/** The 8-row table exactly as domain.md §7 gives it. */
export const THREE_STEP_TABLE: ReadonlyArray<ThreeStepAnswer & { muscle: Muscle }> = [
  { higherEye: 'RE', worseGaze: 'left', worseTilt: 'right', muscle: 'RSO' },
  { higherEye: 'RE', worseGaze: 'left', worseTilt: 'left', muscle: 'LSR' },
  { higherEye: 'RE', worseGaze: 'right', worseTilt: 'left', muscle: 'RIR' },
  { higherEye: 'RE', worseGaze: 'right', worseTilt: 'right', muscle: 'LIO' },
  { higherEye: 'LE', worseGaze: 'right', worseTilt: 'left', muscle: 'LSO' },
  { higherEye: 'LE', worseGaze: 'right', worseTilt: 'right', muscle: 'RSR' },
  { higherEye: 'LE', worseGaze: 'left', worseTilt: 'right', muscle: 'LIR' },
  { higherEye: 'LE', worseGaze: 'left', worseTilt: 'left', muscle: 'RIO' },
]

export const MUSCLE_NAMES: Record<Muscle, string> = {
  RSO: 'right superior oblique',
  LSO: 'left superior oblique',
  RSR: 'right superior rectus',
  LSR: 'left superior rectus',
  RIR: 'right inferior rectus',
  LIR: 'left inferior rectus',
  RIO: 'right inferior oblique',
  LIO: 'left inferior oblique',
}

export function threeStep(a: ThreeStepAnswer): Muscle {
  const row = THREE_STEP_TABLE.find(r => r.higherEye === a.higherEye && r.worseGaze === a.worseGaze && r.worseTilt === a.worseTilt)
  // the table covers all 2×2×2 answers
  return row!.muscle
}

/** Candidates left after the steps answered so far. */
export function threeStepCandidates(a: Partial<ThreeStepAnswer>): Muscle[] {
  return THREE_STEP_TABLE.filter(
    r =>
      (a.higherEye === undefined || r.higherEye === a.higherEye)
      && (a.worseGaze === undefined || r.worseGaze === a.worseGaze)
      && (a.worseTilt === undefined || r.worseTilt === a.worseTilt),
  ).map(r => r.muscle)
}

/** Below this vertical deviation (Δ) in primary there is no hypertropia to analyse. */
export const THREE_STEP_MIN_VERTICAL = 1

/** The three answers as the case's cover-test measurements give them, or null with no hypertropia. */
export function threeStepFromCase(c: Case): ThreeStepAnswer | null {
  const v0 = c.gazes.primary.vertical
  if (Math.abs(v0) < THREE_STEP_MIN_VERTICAL) return null
  const s = Math.sign(v0)
  // how large the primary-position hypertropia is in each test position
  const right = s * c.gazes.right.vertical
  const left = s * c.gazes.left.vertical
  const tiltR = s * c.headTilt.right
  const tiltL = s * c.headTilt.left
  if (right === left || tiltR === tiltL) return null
  return {
    higherEye: v0 > 0 ? 'RE' : 'LE',
    worseGaze: right > left ? 'right' : 'left',
    worseTilt: tiltR > tiltL ? 'right' : 'left',
  }
}

/** Whether the three-step test is the right tool for this case, and why not. */
export function threeStepApplies(c: Case): { applies: boolean, why: string } {
  switch (c.condition) {
    case 'ted-ir-restriction':
      return { applies: false, why: 'The three-step test does not apply to a restrictive problem such as thyroid eye disease with a tight inferior rectus: the deviation comes from a muscle that cannot relax, not from a weak one.' }
    case 'skew-deviation':
      return { applies: false, why: 'The three-step test does not apply to skew deviation, which can mimic a palsy. Compare the vertical deviation upright and lying down: a fall of half or more points to skew.' }
    case 'bilateral-so-palsy':
      return { applies: false, why: 'The three-step test assumes a single palsied muscle; here both superior obliques are weak, so the hypertropia reverses in side gaze and on head tilt.' }
    case 'normal':
    case 'suppression':
      return { applies: false, why: 'There is no paretic vertical deviation to analyse.' }
    case 'hand-authored':
      return c.palsiedMuscles.length === 1
        ? { applies: true, why: '' }
        : { applies: false, why: 'This case was not authored as a single muscle palsy.' }
    default:
      return { applies: true, why: '' }
  }
}

export interface InterpretationMark {
  criterion: 'higher-eye' | 'worse-gaze' | 'worse-tilt' | 'muscle'
  score: number
  reason: string
}

export interface InterpretationResult {
  marks: InterpretationMark[]
  score: number
  answer: Muscle | 'not-applicable'
  explanation: string[]
}

const sideWord = (s: Side) => s
const eyeWord = (e: Eye) => (e === 'RE' ? 'right eye' : 'left eye')
const fmt = (v: number) => `${Math.abs(Math.round(v * 2) / 2)}Δ`

/** Grade a learner's three-step interpretation against the case. */
export function gradeInterpretation(c: Case, answer: InterpretationBody): InterpretationResult {
  const steps = threeStepFromCase(c)
  const applies = threeStepApplies(c)
  const correct: Muscle | 'not-applicable' = applies.applies && c.palsiedMuscles.length === 1 ? c.palsiedMuscles[0]! : 'not-applicable'
  const marks: InterpretationMark[] = []
  const explanation: string[] = ['The three-step test assumes a single palsied cyclovertical muscle.']

  if (steps) {
    const v0 = c.gazes.primary.vertical
    const s = Math.sign(v0)
    explanation.push(
      `Step 1: the ${eyeWord(steps.higherEye)} is higher in primary position (${fmt(v0)}) → ${threeStepCandidates({ higherEye: steps.higherEye }).join(', ')}.`,
      `Step 2: worse in ${sideWord(steps.worseGaze)} gaze (${fmt(s * c.gazes.right.vertical)} in right gaze, ${fmt(s * c.gazes.left.vertical)} in left gaze) → ${threeStepCandidates({ higherEye: steps.higherEye, worseGaze: steps.worseGaze }).join(' or ')}.`,
      `Step 3: worse on head tilt to the ${steps.worseTilt} (${fmt(s * c.headTilt.right)} right, ${fmt(s * c.headTilt.left)} left) → ${MUSCLE_NAMES[threeStep(steps)]}.`,
    )
    const stepMark = (criterion: InterpretationMark['criterion'], given: string | undefined, want: string, label: string) => {
      marks.push(
        given === undefined
          ? { criterion, score: 0, reason: `${label}: not answered.` }
          : given === want
            ? { criterion, score: 1, reason: `${label}: correct.` }
            : { criterion, score: 0, reason: `${label}: the measurements show ${want}, not ${given}.` },
      )
    }
    stepMark('higher-eye', answer.higherEye, steps.higherEye, 'Higher eye')
    stepMark('worse-gaze', answer.worseGaze, steps.worseGaze, 'Worse in gaze to the')
    stepMark('worse-tilt', answer.worseTilt, steps.worseTilt, 'Worse on head tilt to the')
  }
  if (!applies.applies) explanation.push(applies.why)

  const given = answer.muscle
  if (given === undefined) {
    marks.push({ criterion: 'muscle', score: 0, reason: 'No muscle named.' })
  }
  else if (given === correct) {
    marks.push({
      criterion: 'muscle',
      score: 1,
      reason: correct === 'not-applicable' ? 'Correct: the three-step test does not apply here.' : `Correct: ${MUSCLE_NAMES[correct]}.`,
    })
  }
  else {
    const own
      = answer.higherEye && answer.worseGaze && answer.worseTilt
        ? threeStep({ higherEye: answer.higherEye, worseGaze: answer.worseGaze, worseTilt: answer.worseTilt })
        : null
    const carried = own !== null && given === own && correct !== 'not-applicable'
    marks.push({
      criterion: 'muscle',
      score: carried ? 0.5 : 0,
      reason:
        correct === 'not-applicable'
          ? `The three-step test does not point to one muscle here: ${applies.why}`
          : carried
            ? `${MUSCLE_NAMES[given as Muscle]} follows from your steps, but a step was wrong: the answer is the ${MUSCLE_NAMES[correct]}.`
            : `The answer is the ${MUSCLE_NAMES[correct]}${given === 'not-applicable' ? '; the three-step test does apply to this single palsy' : ''}.`,
    })
  }
  const score = marks.reduce((a, m) => a + m.score, 0) / marks.length
  return { marks, score, answer: correct, explanation }
}
