// The grader (domain.md §5.2): marks per criterion, each with a reason that quotes
// the record; the tolerance for the amount only, with partial credit inside twice it;
// signed findings for direction and eye; configurable weights; error-carried-forward
// from the learner's own dial readings; slips (§5.3), each counted once; the cap of
// critical slips (shared/engine/marking.ts).

import { readingToTorsion, torsionToReading, wrapAxisDifference } from '#shared/engine/dial'
import { parseRecord, readAsLine, GAZE_LABEL } from '#shared/engine/parser'
import type { EyeRecord, GazeSection, ParsedRecord } from '#shared/engine/parser'
import { cappedPoints, hasDirection, misleadingLine } from '#shared/engine/marking'
import { SLIP_INFO, slipExplanation } from '#shared/engine/slips'
import type { Slip, SlipCode } from '#shared/engine/slips'
import type { Distance, Eye, Gaze, PerEye } from '#shared/engine/types'
import { EYES, otherEye } from '#shared/engine/types'
import { NOT_PERFORMED_RECORD, modelRecord } from './model-record'
import { eyesSwapped, judgeEye, likeliestEye } from './grade-eyes'
import type { EyeVerdict } from './grade-eyes'
import type { RecordGrade } from '#shared/types/practice'
import { degWords, eyeWords, findingWords, wroteWords } from './grade-words'

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

/** A record graded, with the grader's own marks. */
export type GradeResult = RecordGrade<GradeMark>

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

const band = (err: number, tol: number): number => (err <= tol ? 1 : err <= 2 * tol ? 0.5 : 0)
// a per-eye criterion is only as good as the worse eye: a wrong right eye is not halved by a correct left eye
const worst = (xs: number[]): number => (xs.length === 0 ? 1 : Math.min(...xs))

/** The section of a record that concerns the graded position of gaze. */
function sectionFor(p: ParsedRecord, gaze?: Gaze): GazeSection {
  if (gaze && p.sections.length > 1) return p.sections.find(s => s.gaze === gaze) ?? p.sections[0]!
  return p.sections[0]!
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
  return `with ${degWords(reading)} on the ${eyeWords(eye)}'s dial, this is the ${eyeWords(other)}'s rule (${other === 'RE' ? 'reading − 90' : '90 − reading'}) or the tilt of the image`
}

function weightOf(opts: GradeOptions | undefined, c: GradeCriterion): number {
  return opts?.weights?.[c] ?? DEFAULT_GRADE_WEIGHTS[c]
}

/** Each slip once: the same code on the same eye is one slip. */
function uniqueSlips(slips: Slip[]): Slip[] {
  const seen = new Set<string>()
  return slips.filter((s) => {
    const key = `${s.code}/${s.eye ?? ''}`
    if (seen.has(key)) return false
    seen.add(key)
    return true
  })
}

function finish(parsed: ParsedRecord, marks: GradeMark[], rawSlips: Slip[], model: string, explanation: string[]): GradeResult {
  const slips = uniqueSlips(rawSlips)
  const { earned, possible, cap } = cappedPoints(marks, slips)
  const misleading = misleadingLine(slips)
  const lead: string[] = misleading ? [`${misleading} A record with a critical slip scores at most half the points.`] : []
  const seen = new Set<SlipCode>()
  for (const s of slips) {
    if (seen.has(s.code)) continue
    seen.add(s.code)
    explanation.push(`${SLIP_INFO[s.code].title}: ${slipExplanation(s.code, s.eye)}`)
  }
  for (const p of parsed.problems) explanation.push(`Could not read: ${p.message}`)
  return {
    readAs: readAsLine(parsed),
    parsed,
    marks,
    score: possible === 0 ? 0 : earned / possible,
    points: { earned, possible },
    cap,
    slips,
    modelRecord: model,
    explanation: [...lead, ...explanation],
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
    reason: stopped
      ? 'Right: you stopped instead of recording a misleading result.'
      : `You recorded a measurement (${readAsLine(parsed)}); this patient sees one streak only, so the test should have been stopped.`,
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
      return { criterion: 'test', weight, score: 0.5, reason: 'You wrote "Maddox rod": say which test, double Maddox rod (DMR).' }
    case 'single-maddox-rod':
      return { criterion: 'test', weight, score: 0, reason: 'You named the single Maddox rod; the test done was the double Maddox rod.' }
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
    `Finding in ${gazeName}: RE ${findingWords(input.expected.RE)} (level at ${degWords(torsionToReading('RE', input.expected.RE))} on the dial), LE ${findingWords(input.expected.LE)} (level at ${degWords(torsionToReading('LE', input.expected.LE))}).`,
    'Cyclodial\'s dial marks the rod axis, 90° at no torsion. Right eye: torsion = reading − 90. Left eye: torsion = 90 − reading. Positive = excyclo. An eye under 1° has no torsion worth a direction.',
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
        reasons.push(err <= readTol ? `${eye}: you read ${degWords(r)}, where the patient left the rod.` : `${eye}: you read ${degWords(r)}, but the patient left the rod at ${degWords(at)}.`)
        if (err > readTol) slips.push({ code: 'not-parallel', eye, detail: `read ${degWords(r)}, rod at ${degWords(at)}` })
      }
      else {
        const at = input.levelAt?.[eye] ?? torsionToReading(eye, input.expected[eye])
        const err = Math.abs(wrapAxisDifference(r - at))
        scores.push(band(err, tol))
        reasons.push(err <= tol ? `${eye}: you set ${degWords(r)}, where the line looks level.` : `${eye}: you set ${degWords(r)}; the line looks level at ${degWords(at)}.`)
        if (err > tol) slips.push({ code: 'not-parallel', eye, detail: `set ${degWords(r)}, level at ${degWords(at)}` })
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
    marks.push({ criterion: 'gaze', weight: gw, score: 0, reason: `You wrote ${GAZE_LABEL[section.gaze].toLowerCase()}, but the measurement was in ${gazeName}.` })
  }
  else {
    marks.push({ criterion: 'gaze', weight: gw, score: 1, reason: `Position of gaze: ${GAZE_LABEL[section.gaze].toLowerCase()}.` })
  }

  // fixation distance (domain.md §5.1 lists it in a complete record)
  if (input.distance) {
    const dw = weightOf(o, 'distance')
    if (parsed.distance === null) marks.push({ criterion: 'distance', weight: dw, score: 0, reason: 'The fixation distance is not stated.' })
    else if (parsed.distance !== input.distance) marks.push({ criterion: 'distance', weight: dw, score: 0, reason: `You wrote ${parsed.distance}, but the fixation was at ${input.distance}.` })
    else marks.push({ criterion: 'distance', weight: dw, score: 1, reason: `Fixation distance: ${input.distance}.` })
  }
  return finish(parsed, marks, slips, model, explanation)
}

type Push = (criterion: 'direction' | 'amount' | 'eye', score: number, reason: string) => void

/** No finding placed against an eye: a total, a finding without an eye, or nothing at all. */
function gradeWithoutEyes(input: RecordGradeInput, section: GazeSection, tol: number, push: Push, slips: Slip[]) {
  const t = input.expected
  if (section.total && section.total.amount !== null) {
    const v = judgeEye(section.total, t.RE + t.LE, 'RE', tol, 'Total')
    push('direction', v.direction, v.directionReason)
    push('amount', v.amount, v.amountReason)
    slips.push(...v.slips.map(({ eye: _e, ...s }) => s))
    push('eye', 0, 'A total does not say which eye is torted.')
    slips.push({ code: 'eye-missing' })
    return
  }
  const unplaced = section.unplaced?.[0]
  if (unplaced) {
    // the finding is marked as written; only the eye is missing (one slip, not two)
    const eye = likeliestEye(unplaced, t)
    const v = judgeEye(unplaced, t[eye], eye, tol, '')
    push('direction', v.direction, v.directionReason)
    push('amount', v.amount, v.amountReason)
    slips.push(...v.slips.filter(s => s.code !== 'amount-missing' && s.code !== 'direction-missing'))
    push('eye', 0, 'The record does not say which eye the finding belongs to.')
    // the record gives no way to know which eye was meant, so the slip names none
    slips.push({ code: 'eye-missing' })
    return
  }
  push('direction', 0, 'No finding is written.')
  push('amount', 0, 'No finding is written.')
  push('eye', 0, 'The record does not say which eye is torted.')
  slips.push({ code: 'amount-missing' }, { code: 'eye-missing' })
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
  const rec = section.eyes
  const push: Push = (criterion, score, reason) => marks.push({ criterion, weight: weightOf(o, criterion), score, reason })

  if (!rec.RE && !rec.LE) return gradeWithoutEyes(input, section, tol, push, slips)

  // torsion written against the other eye? Then each entry is judged against the eye it describes
  const alsoRight = { RE: references(input, 'RE').slice(1).map(r => r.t), LE: references(input, 'LE').slice(1).map(r => r.t) }
  const swapped = eyesSwapped(rec, t, tol, alsoRight)
  const amounts: number[] = []
  const directions: number[] = []
  const eyeScores: number[] = []
  const aReasons: string[] = []
  const dReasons: string[] = []
  const eReasons: string[] = []
  for (const e of EYES) {
    const written = swapped ? otherEye(e) : e
    const r: EyeRecord | undefined = rec[written]
    if (!r && !hasDirection(t[e])) continue
    if (swapped && hasDirection(t[e])) {
      slips.push({ code: 'eye-wrong', eye: e, detail: `the ${eyeWords(e)}'s torsion was written against the ${eyeWords(otherEye(e))}` })
      eReasons.push(`${wroteWords(written, r)}; that is the ${eyeWords(e)}'s finding (${findingWords(t[e])}).`)
      eyeScores.push(0)
    }
    if (!r) {
      amounts.push(0)
      directions.push(0)
      eyeScores.push(0)
      aReasons.push(`${e}: not recorded.`)
      dReasons.push(`${e}: not recorded.`)
      eReasons.push(`${wroteWords(e, undefined)}; it has ${findingWords(t[e])}.`)
      slips.push({ code: 'eye-missing', eye: e })
      continue
    }
    if (!swapped) eyeScores.push(1)
    const refs = swapped ? [{ kind: 'finding' as const, t: t[e] }] : references(input, e)
    let best: { v: EyeVerdict, ref: Reference } | null = null
    for (const ref of refs) {
      const v = judgeEye(r, ref.t, e, tol, written)
      if (!best || v.amount + v.direction > best.v.amount + best.v.direction) best = { v, ref }
    }
    const { v, ref } = best!
    amounts.push(v.amount)
    directions.push(v.direction)
    const carried = ref.kind === 'own-reading' && Math.abs(ref.t - t[e]) > tol
    aReasons.push(v.amountReason + (carried ? ' (follows from your own reading: error carried forward)' : ''))
    dReasons.push(v.directionReason + (carried ? ' (follows from your own reading)' : ''))
    // the dial that was read for this eye's torsion names the rule a reversed direction matches
    const own = input.readings?.[e]
    slips.push(...v.slips.map(sl => (sl.code === 'direction-reversed' && own !== undefined ? { ...sl, detail: ruleHint(e, own) } : sl)))
    if (carried) {
      explanation.push(`${e}: your record converts your own reading correctly, so only the measurement mark is lost (error carried forward).`)
    }
  }
  push('direction', worst(directions), dReasons.join(' '))
  push('amount', worst(amounts), aReasons.join(' '))
  push('eye', swapped ? 0 : worst(eyeScores), eReasons.length ? eReasons.join(' ') : 'Each finding is written against the right eye.')

  if (section.total && section.total.amount !== null && section.total.direction && section.total.direction !== 'none') {
    const sum = EYES.reduce((a, e) => {
      const r = rec[e]
      if (!r || r.amount === null || r.direction === null) return a
      return a + (r.direction === 'incyclo' ? -r.amount : r.direction === 'excyclo' ? r.amount : 0)
    }, 0)
    const total = section.total.direction === 'incyclo' ? -section.total.amount : section.total.amount
    if (Math.abs(sum - total) > 1) explanation.push(`Your total (${findingWords(total)}) does not match the sum of your eyes (${findingWords(sum)}).`)
  }
}
