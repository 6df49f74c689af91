// The grader (domain.md §5.2): marks per criterion, each with a short reason;
// tolerance with partial credit inside twice it; configurable weights;
// error-carried-forward from the learner's own dial readings; slips (§5.3).

import { readingToTorsion, torsionToReading, wrapAxisDifference } from '#shared/engine/dial'
import { parseRecord, readAsLine, GAZE_LABEL } from '#shared/engine/parser'
import type { EyeRecord, GazeSection, ParsedRecord } from '#shared/engine/parser'
import { SLIP_INFO } from '#shared/engine/slips'
import type { Slip, SlipCode } from '#shared/engine/slips'
import type { Distance, Eye, Gaze, PerEye } from '#shared/engine/types'
import { EYES, otherEye } from '#shared/engine/types'
import { NOT_PERFORMED_RECORD, modelRecord } from './modelRecord'

export const GRADE_CRITERIA = ['measurement', 'direction', 'amount', 'eye', 'test', 'gaze', 'distance', 'action', 'reason'] as const
export type GradeCriterion = (typeof GRADE_CRITERIA)[number]

/** Default weights. `action`/`reason` are only used for a patient who must not be tested. */
export const DEFAULT_GRADE_WEIGHTS: Record<GradeCriterion, number> = {
  measurement: 2,
  direction: 2,
  amount: 2,
  eye: 1,
  test: 1,
  gaze: 1,
  distance: 1,
  action: 3,
  reason: 1,
}
export const DEFAULT_GRADE_TOLERANCE = 2
/** Patient-turns: how closely the learner must read the scale where the patient left the rod. */
export const DEFAULT_GRADE_READING_TOLERANCE = 1
/** An "amount" this large can only be a figure copied off the dial. */
export const DIAL_FIGURE_FROM = 45

export interface GradeOptions {
  tolerance?: number
  readingTolerance?: number
  weights?: Partial<Record<GradeCriterion, number>>
}

export interface GradeMark {
  criterion: GradeCriterion
  /** 0, 0.5 (partial credit) or 1; for per-eye criteria, the worse eye's score. */
  score: number
  weight: number
  reason: string
}

export interface GradeResult {
  readAs: string
  parsed: ParsedRecord
  marks: GradeMark[]
  /** Weighted score, 0–1. */
  score: number
  points: { earned: number, possible: number }
  slips: Slip[]
  modelRecord: string
  explanation: string[]
}

export interface RecordGradeInput {
  record: string
  /** The finding to record: signed torsion per eye (positive = excyclo) as the test shows it. */
  expected: PerEye<number>
  /** Position of gaze of the measurement; unknown → only "is one named" is marked. */
  gaze?: Gaze
  /** Fixation distance; unknown → not marked. */
  distance?: Distance
  /** The learner's own dial readings (rod axis). */
  readings?: Partial<PerEye<number>>
  /** Learner-turns: where each streak looks level for the learner's setting (prisms included). */
  levelAt?: PerEye<number>
  /** Patient-turns: where the patient left each rod. */
  patientSettings?: PerEye<number>
  /** The patient cannot see both streaks: the right action is to stop and say why. */
  shouldNotTest?: boolean
  options?: GradeOptions
}

const eyeName = (e: Eye): string => (e === 'RE' ? 'right eye' : 'left eye')
const deg = (v: number): string => `${Math.round(Math.abs(v) * 10) / 10}°`
const dirWord = (t: number): string => (t > 0 ? 'excyclo' : t < 0 ? 'incyclo' : 'no torsion')
const finding = (t: number): string => (Math.abs(t) < 0.05 ? 'no torsion' : `${deg(t)} ${dirWord(t)}`)
const band = (err: number, tol: number): number => (err <= tol ? 1 : err <= 2 * tol ? 0.5 : 0)
// a per-eye criterion is only as good as the worse eye: a wrong right eye is not halved by a correct left eye
const worst = (xs: number[]): number => (xs.length === 0 ? 1 : Math.min(...xs))

/** The section of a record that concerns the graded position of gaze. */
function sectionFor(p: ParsedRecord, gaze?: Gaze): GazeSection {
  if (gaze && p.sections.length > 1) return p.sections.find(s => s.gaze === gaze) ?? p.sections[0]!
  return p.sections[0]!
}

/** How far a recorded entry is from a signed torsion, for deciding which eye it was meant for. */
function misfit(r: EyeRecord | undefined, t: number, flip = false): number {
  // nothing written, or "no torsion": the whole torsion is unexplained
  if (!r || r.direction === 'none' || r.amount === null) return Math.abs(t)
  const a = r.amount >= DIAL_FIGURE_FROM ? Math.abs(r.amount - 90) : r.amount
  if (r.direction === null) return Math.abs(a - Math.abs(t))
  const s = (r.direction === 'incyclo' ? -a : a) * (flip ? -1 : 1)
  return Math.abs(s - t)
}

interface EyeVerdict {
  amount: number
  direction: number
  slips: Slip[]
  amountReason: string
  directionReason: string
}

function judge(r: EyeRecord, t: number, eye: Eye, tol: number): EyeVerdict {
  const slips: Slip[] = []
  let amount: number
  let amountReason: string
  const a = r.direction === 'none' ? 0 : r.amount
  if (a === null) {
    amount = 0
    amountReason = `${eye}: no amount.`
    slips.push({ code: 'amount-missing', eye })
  }
  else if (a >= DIAL_FIGURE_FROM && a <= 180) {
    amount = 0
    amountReason = `${eye}: ${a}° is a dial figure; the amount is the change from 90°.`
    slips.push({ code: 'dial-value-as-amount', eye, detail: `wrote ${a}°; ${Math.abs(a - 90)}° from 90° is the amount` })
  }
  else {
    const err = Math.abs(a - Math.abs(t))
    amount = band(err, tol)
    amountReason
      = amount === 1
        ? `${eye}: ${a}° is within ${tol}° of ${deg(t)}.`
        : `${eye}: ${a}° is ${deg(err)} from ${deg(t)}${amount === 0.5 ? ' (partial credit within twice the tolerance)' : ''}.`
    if (err > tol) slips.push({ code: 'amount-off', eye, detail: `${a}° recorded, ${deg(t)} found` })
  }
  let direction: number
  let directionReason: string
  if (Math.abs(t) <= tol) {
    const missing = r.direction === null && (r.amount ?? 0) > 0
    direction = missing ? 0 : 1
    directionReason = missing ? `${eye}: no direction given.` : `${eye}: no meaningful torsion to give a direction to.`
    if (missing) slips.push({ code: 'direction-missing', eye })
  }
  else if (r.direction === null) {
    direction = 0
    directionReason = `${eye}: no direction given.`
    slips.push({ code: 'direction-missing', eye })
  }
  else if (r.direction === 'none') {
    direction = 0
    directionReason = `${eye}: recorded no torsion, but the eye is ${dirWord(t)}torted.`
  }
  else if ((r.direction === 'excyclo') === (t > 0)) {
    direction = 1
    directionReason = `${eye}: ${r.direction} is right.`
  }
  else {
    direction = 0
    directionReason = `${eye}: ${r.direction} is reversed; the eye is ${dirWord(t)}torted.`
    slips.push({ code: 'direction-reversed', eye })
  }
  return { amount, direction, slips, amountReason, directionReason }
}

interface Reference {
  kind: 'finding' | 'own-reading' | 'patient-setting'
  t: number
}

function references(input: RecordGradeInput, eye: Eye): Reference[] {
  const refs: Reference[] = [{ kind: 'finding', t: input.expected[eye] }]
  const own = input.readings?.[eye]
  if (own !== undefined) refs.push({ kind: 'own-reading', t: readingToTorsion(eye, own) })
  const set = input.patientSettings?.[eye]
  if (set !== undefined) refs.push({ kind: 'patient-setting', t: readingToTorsion(eye, set) })
  return refs
}

/** Say which reading rule a reversed direction matches, so the slip-patterns page can spot a swapped rule. */
function ruleHint(eye: Eye, reading: number): string {
  const other = otherEye(eye)
  return `with ${deg(reading)} on the ${eyeName(eye)} dial, this is the ${eyeName(other)}'s rule (${other === 'RE' ? 'reading − 90' : '90 − reading'}) or the tilt of the image`
}

function weightOf(opts: GradeOptions | undefined, c: GradeCriterion): number {
  return opts?.weights?.[c] ?? DEFAULT_GRADE_WEIGHTS[c]
}

function finish(parsed: ParsedRecord, marks: GradeMark[], slips: Slip[], model: string, explanation: string[]): GradeResult {
  const possible = marks.reduce((a, m) => a + m.weight, 0)
  const earned = marks.reduce((a, m) => a + m.weight * m.score, 0)
  const seen = new Set<SlipCode>()
  for (const s of slips) {
    if (seen.has(s.code)) continue
    seen.add(s.code)
    explanation.push(`${SLIP_INFO[s.code].title}: ${SLIP_INFO[s.code].explanation}`)
  }
  for (const p of parsed.problems) explanation.push(`Could not read: ${p.message}`)
  return {
    readAs: readAsLine(parsed),
    parsed,
    marks,
    score: possible === 0 ? 0 : earned / possible,
    points: { earned, possible },
    slips,
    modelRecord: model,
    explanation,
  }
}

function gradeNotTestable(input: RecordGradeInput, parsed: ParsedRecord): GradeResult {
  const o = input.options
  const marks: GradeMark[] = []
  const slips: Slip[] = []
  const stopped = parsed.notPerformed !== null
  marks.push({
    criterion: 'action',
    weight: weightOf(o, 'action'),
    score: stopped ? 1 : 0,
    reason: stopped ? 'Right: you stopped instead of recording a misleading result.' : 'This patient sees one streak only; the test should not have been recorded as performed.',
  })
  if (!stopped) slips.push({ code: 'should-not-test' })
  const reasons = parsed.notPerformed?.reasons ?? []
  const named = reasons.some(r => r !== 'unstated')
  marks.push({
    criterion: 'reason',
    weight: weightOf(o, 'reason'),
    score: named ? 1 : 0,
    reason: named ? 'The reason is recorded.' : 'Record why: sees one streak only (suppression).',
  })
  marks.push(testMark(parsed, o, slips))
  return finish(parsed, marks, slips, NOT_PERFORMED_RECORD, [
    'With dense suppression or abnormal retinal correspondence the patient cannot see both streaks, so the double Maddox rod result would mislead. Stop and record why.',
  ])
}

function testMark(parsed: ParsedRecord, o: GradeOptions | undefined, slips: Slip[]): GradeMark {
  const weight = weightOf(o, 'test')
  switch (parsed.test) {
    case 'double-maddox-rod':
      return { criterion: 'test', weight, score: 1, reason: 'Test named: double Maddox rod.' }
    case 'maddox-rod':
      return { criterion: 'test', weight, score: 0.5, reason: 'Say which Maddox rod test: double Maddox rod (DMR).' }
    case 'single-maddox-rod':
      return { criterion: 'test', weight, score: 0, reason: 'The test done was the double Maddox rod, not the single.' }
    default:
      slips.push({ code: 'test-unnamed' })
      return { criterion: 'test', weight, score: 0, reason: 'The test is not named.' }
  }
}

/** Grade a written record against a finding (the core of attempts and the record checker). */
export function gradeRecord(input: RecordGradeInput): GradeResult {
  const parsed = parseRecord(input.record)
  if (input.shouldNotTest) return gradeNotTestable(input, parsed)

  const o = input.options
  const tol = o?.tolerance ?? DEFAULT_GRADE_TOLERANCE
  const readTol = o?.readingTolerance ?? DEFAULT_GRADE_READING_TOLERANCE
  const marks: GradeMark[] = []
  const slips: Slip[] = []
  const explanation: string[] = []
  const model = modelRecord({ torsion: input.expected, gaze: input.gaze ?? 'primary', distance: input.distance, tolerance: tol })
  const gazeName = input.gaze ? GAZE_LABEL[input.gaze].toLowerCase() : 'this position'
  explanation.push(
    `Finding in ${gazeName}: RE ${finding(input.expected.RE)} (level at ${deg(torsionToReading('RE', input.expected.RE))} on the dial), LE ${finding(input.expected.LE)} (level at ${deg(torsionToReading('LE', input.expected.LE))}).`,
    'Cyclodial\'s dial marks the rod axis, 90° at no torsion. Right eye: torsion = reading − 90. Left eye: torsion = 90 − reading. Positive = excyclo.',
  )

  if (parsed.notPerformed) {
    for (const c of ['measurement', 'direction', 'amount', 'eye'] as const) {
      marks.push({ criterion: c, weight: weightOf(o, c), score: 0, reason: 'The record says the test was not performed, but this patient sees both streaks.' })
    }
    marks.push(testMark(parsed, o, slips))
    return finish(parsed, marks, slips, model, explanation)
  }

  const section = sectionFor(parsed, input.gaze)

  // measurement: the learner's own dial setting
  if (input.readings && (input.readings.RE !== undefined || input.readings.LE !== undefined)) {
    const scores: number[] = []
    const reasons: string[] = []
    for (const eye of EYES) {
      const r = input.readings[eye]
      if (r === undefined) continue
      if (input.patientSettings) {
        const at = input.patientSettings[eye]
        const err = Math.abs(wrapAxisDifference(r - at))
        scores.push(band(err, readTol))
        reasons.push(err <= readTol ? `${eye}: read ${deg(r)} correctly.` : `${eye}: read ${deg(r)} but the patient left the rod at ${deg(at)}.`)
        if (err > readTol) slips.push({ code: 'not-parallel', eye, detail: `read ${deg(r)}, rod at ${deg(at)}` })
      }
      else {
        const at = input.levelAt?.[eye] ?? torsionToReading(eye, input.expected[eye])
        const err = Math.abs(wrapAxisDifference(r - at))
        scores.push(band(err, tol))
        reasons.push(err <= tol ? `${eye}: ${deg(r)} is where the line looks level.` : `${eye}: the line looks level at ${deg(at)}, not ${deg(r)}.`)
        if (err > tol) slips.push({ code: 'not-parallel', eye, detail: `set ${deg(r)}, level at ${deg(at)}` })
      }
    }
    marks.push({ criterion: 'measurement', weight: weightOf(o, 'measurement'), score: worst(scores), reason: reasons.join(' ') })
  }

  gradeEyes(input, section, tol, o, marks, slips, explanation)
  marks.push(testMark(parsed, o, slips))

  // position of gaze
  const gw = weightOf(o, 'gaze')
  if (section.gaze === null) {
    slips.push({ code: 'gaze-missing' })
    marks.push({ criterion: 'gaze', weight: gw, score: 0, reason: 'The position of gaze is not stated.' })
  }
  else if (input.gaze && section.gaze !== input.gaze) {
    marks.push({ criterion: 'gaze', weight: gw, score: 0, reason: `Recorded ${GAZE_LABEL[section.gaze].toLowerCase()}, but the measurement was in ${gazeName}.` })
  }
  else {
    marks.push({ criterion: 'gaze', weight: gw, score: 1, reason: `Position of gaze: ${GAZE_LABEL[section.gaze].toLowerCase()}.` })
  }

  // fixation distance (domain.md §5.1 lists it in a complete record)
  if (input.distance) {
    const dw = weightOf(o, 'distance')
    if (parsed.distance === null) marks.push({ criterion: 'distance', weight: dw, score: 0, reason: 'The fixation distance is not stated.' })
    else if (parsed.distance !== input.distance) marks.push({ criterion: 'distance', weight: dw, score: 0, reason: `Recorded ${parsed.distance}, but the fixation was at ${input.distance}.` })
    else marks.push({ criterion: 'distance', weight: dw, score: 1, reason: `Fixation distance: ${input.distance}.` })
  }
  return finish(parsed, marks, slips, model, explanation)
}

function gradeEyes(
  input: RecordGradeInput,
  section: GazeSection,
  tol: number,
  o: GradeOptions | undefined,
  marks: GradeMark[],
  slips: Slip[],
  explanation: string[],
) {
  const t = input.expected
  const significant = (e: Eye) => Math.abs(t[e]) > tol
  const rec = section.eyes
  const push = (criterion: 'direction' | 'amount' | 'eye', score: number, reason: string) =>
    marks.push({ criterion, weight: weightOf(o, criterion), score, reason })

  if (!rec.RE && !rec.LE) {
    if (section.total && section.total.amount !== null) {
      const total = t.RE + t.LE
      const v = judge(section.total, total, 'RE', tol)
      push('direction', v.direction, `Total: ${v.directionReason.replace(/^RE: /, '')}`)
      push('amount', v.amount, `Total: ${v.amountReason.replace(/^RE: /, '')}`)
      slips.push(...v.slips.map(({ eye: _e, ...s }) => s))
    }
    else {
      push('direction', 0, 'No finding could be placed against an eye.')
      push('amount', 0, 'No finding could be placed against an eye.')
      if (!section.total) slips.push({ code: 'amount-missing' })
    }
    push('eye', 0, 'The record does not say which eye is torted.')
    slips.push({ code: 'eye-missing' })
    return
  }

  // torsion written against the other eye? (only when that explains the record better
  // than reading it as written or with its directions reversed)
  const direct = EYES.reduce((a, e) => a + misfit(rec[e], t[e]), 0)
  const swapped = EYES.reduce((a, e) => a + misfit(rec[otherEye(e)], t[e]), 0)
  const reversed = EYES.reduce((a, e) => a + misfit(rec[e], t[e], true), 0)
  const eyeWrong
    = EYES.some(significant)
      && swapped + 0.5 < direct
      && swapped + 0.5 < reversed
      && EYES.every(e => !significant(e) || misfit(rec[otherEye(e)], t[e]) <= tol)

  const graded = EYES.filter(e => significant(e) || rec[e] !== undefined)
  const amounts: number[] = []
  const directions: number[] = []
  const eyeScores: number[] = []
  const aReasons: string[] = []
  const dReasons: string[] = []
  const eReasons: string[] = []
  for (const e of graded) {
    const r = rec[eyeWrong ? otherEye(e) : e]
    if (!r && !significant(e)) continue
    if (eyeWrong && significant(e)) {
      slips.push({ code: 'eye-wrong', eye: e, detail: `the ${eyeName(e)}'s torsion was written against the ${eyeName(otherEye(e))}` })
      eReasons.push(`The torsion belongs to the ${eyeName(e)}.`)
      eyeScores.push(0)
    }
    if (!r) {
      amounts.push(0)
      directions.push(0)
      eyeScores.push(0)
      aReasons.push(`${e}: not recorded.`)
      dReasons.push(`${e}: not recorded.`)
      eReasons.push(`The ${eyeName(e)} (${finding(t[e])}) is not recorded.`)
      slips.push({ code: 'eye-missing', eye: e })
      continue
    }
    if (!eyeWrong) eyeScores.push(1)
    const refs = eyeWrong ? [{ kind: 'finding' as const, t: t[e] }] : references(input, e)
    let best: { v: EyeVerdict, ref: Reference } | null = null
    for (const ref of refs) {
      const v = judge(r, ref.t, e, tol)
      if (!best || v.amount + v.direction > best.v.amount + best.v.direction) best = { v, ref }
    }
    const { v, ref } = best!
    amounts.push(v.amount)
    directions.push(v.direction)
    const carried = ref.kind === 'own-reading' && Math.abs(ref.t - t[e]) > tol
    aReasons.push(v.amountReason + (carried ? ' (follows from your own reading: error carried forward)' : ''))
    dReasons.push(v.directionReason + (carried ? ' (follows from your own reading)' : ''))
    const own = input.readings?.[e]
    slips.push(...v.slips.map(sl => (sl.code === 'direction-reversed' && own !== undefined ? { ...sl, detail: ruleHint(e, own) } : sl)))
    if (carried) {
      explanation.push(
        `${e}: your record converts your own reading correctly, so only the measurement mark is lost (error carried forward).`,
      )
    }
  }
  push('direction', worst(directions), dReasons.join(' '))
  push('amount', worst(amounts), aReasons.join(' '))
  push('eye', eyeWrong ? 0 : worst(eyeScores), eReasons.length ? eReasons.join(' ') : 'Torsion attributed to the correct eye(s).')

  if (section.total && section.total.amount !== null && section.total.direction && section.total.direction !== 'none') {
    const sum = EYES.reduce((a, e) => {
      const r = rec[e]
      if (!r || r.amount === null || r.direction === null) return a
      return a + (r.direction === 'incyclo' ? -r.amount : r.direction === 'excyclo' ? r.amount : 0)
    }, 0)
    const total = section.total.direction === 'incyclo' ? -section.total.amount : section.total.amount
    if (Math.abs(sum - total) > 1) explanation.push(`Your total (${finding(total)}) does not match the sum of your eyes (${finding(sum)}).`)
  }
}
