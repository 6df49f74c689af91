// Grading a fundus measurement: per eye, the angle the learner's marks make
// against the picture's angle, and the finding recorded against the finding that
// angle stands for (normal range: mean ± 2 SD of J Korean Ophthalmol Soc
// 2005;46(10):1684-9). The angle is computed here from the marks, never taken from
// the browser. A finding that follows from the learner's own (inexact) angle keeps
// its mark: error carried forward, as in the double Maddox rod grader.

import type { Point } from '#shared/engine/fundus/geometry'
import { discFoveaAngle, distance } from '#shared/engine/fundus/geometry'
import { FUNDUS_FINDING_LABELS, FUNDUS_SOURCES, NORMAL_DISC_FOVEA_HORIZONTAL, NORMAL_RANGES, acceptableFindings, findingForAngle } from '#shared/engine/fundus/normals'
import type { FundusFinding } from '#shared/engine/fundus/normals'
import type { FundusEyeMarks, FundusEyeResult, FundusGradeResult, FundusMark } from '#shared/engine/fundus/result'
import type { Eye, PerEye } from '#shared/engine/types'

/** Degrees: within it the angle mark is full, within twice it half. */
export const FUNDUS_ANGLE_TOLERANCE = 1
/** A mark further than this from its point earns a note, disc diameters (model choice). */
const PLACEMENT_NOTE_FROM = 0.25

export interface FundusReference {
  eye: Eye
  disc: Point
  fovea: Point
  /** One disc diameter in the picture's unit (1 for generated pictures). */
  ddUnit: number
}

const round1 = (v: number): number => Math.round(v * 10) / 10
const deg = (v: number): string => `${round1(v).toFixed(1)}°`
const label = (f: FundusFinding): string => FUNDUS_FINDING_LABELS[f].toLowerCase()

/** One disc diameter for a photograph, from its reference marks (about 2.6 DD apart, 2005 figures). */
export const ddUnitFromMarks = (disc: Point, fovea: Point): number =>
  distance(disc, fovea) / NORMAL_DISC_FOVEA_HORIZONTAL.mean || 1

function angleMark(eye: Eye, measured: number, reference: number, tolerance: number): FundusMark {
  const off = Math.abs(measured - reference)
  if (Math.abs(measured) > 90) {
    return { criterion: 'angle', eye, score: 0, weight: 1, code: 'marks-swapped', reason: `Your fovea mark lies on the nasal side of the disc (angle ${deg(measured)}): check which mark is the disc centre and which the fovea.` }
  }
  if (off <= tolerance) return { criterion: 'angle', eye, score: 1, weight: 1, reason: `Your marks make ${deg(measured)}; the picture shows ${deg(reference)}.` }
  if (off <= 2 * tolerance) return { criterion: 'angle', eye, score: 0.5, weight: 1, code: 'angle-off', reason: `Your marks make ${deg(measured)}, ${deg(off)} from the picture's ${deg(reference)}: close, but place the marks more exactly.` }
  return { criterion: 'angle', eye, score: 0, weight: 1, code: 'angle-off', reason: `Your marks make ${deg(measured)}, ${deg(off)} from the picture's ${deg(reference)}.` }
}

function findingMark(eye: Eye, given: FundusFinding, accepted: FundusFinding[], expected: FundusFinding, measured: number): FundusMark {
  if (accepted.includes(given)) {
    const reason = accepted.length > 1
      ? `The angle sits within a degree of a limit of the normal range, so ${accepted.map(label).join(' or ')} is accepted.`
      : `Correct: ${label(expected)}.`
    return { criterion: 'finding', eye, score: 1, weight: 1, reason }
  }
  if (Math.abs(measured) <= 90 && given === findingForAngle(eye, measured)) {
    return { criterion: 'finding', eye, score: 1, weight: 1, reason: `Your finding follows from your own angle (${deg(measured)}), so it keeps its mark; the picture itself shows ${label(expected)}.` }
  }
  const reversed = (given === 'excyclo' && expected === 'incyclo') || (given === 'incyclo' && expected === 'excyclo')
  return {
    criterion: 'finding',
    eye,
    score: 0,
    weight: 1,
    code: reversed ? 'finding-reversed' : 'finding-wrong',
    reason: reversed
      ? `Reversed: the picture shows ${label(expected)}. A larger angle (fovea further below the disc) is excyclotorsion; a smaller one, or the fovea above the disc centre, incyclotorsion.`
      : `The picture shows ${label(expected)}, not ${label(given)}.`,
  }
}

function placementNotes(eye: Eye, ref: FundusReference, marks: FundusEyeMarks, approximate: boolean): { notes: string[], offsets: { disc: number, fovea: number } } {
  const disc = distance(marks.disc, ref.disc) / ref.ddUnit
  const fovea = distance(marks.fovea, ref.fovea) / ref.ddUnit
  const about = approximate ? 'about ' : ''
  const notes: string[] = []
  if (disc > PLACEMENT_NOTE_FROM) notes.push(`${eye}: your disc mark is ${about}${disc.toFixed(2)} disc diameters from the disc centre. Aim for the middle of the whole disc, not the cup or the point where the vessels leave it.`)
  if (fovea > PLACEMENT_NOTE_FROM) notes.push(`${eye}: your fovea mark is ${about}${fovea.toFixed(2)} disc diameters from the fovea. The fovea is the centre of the darker macula, free of vessels, often with a small light reflex.`)
  return { notes, offsets: { disc: Math.round(disc * 100) / 100, fovea: Math.round(fovea * 100) / 100 } }
}

export interface FundusGradeInput {
  references: Partial<PerEye<FundusReference>>
  marks: Partial<PerEye<FundusEyeMarks>>
  /** Placement distances are estimates (photographs, where a disc diameter is inferred). */
  approximate?: boolean
  tolerance?: number
}

/** Grade the eyes that have a reference; the caller checks that every needed eye was marked. */
export function gradeFundus(input: FundusGradeInput): FundusGradeResult {
  const tolerance = input.tolerance ?? FUNDUS_ANGLE_TOLERANCE
  const eyes: Partial<PerEye<FundusEyeResult>> = {}
  const explanation: string[] = [
    'The disc–fovea angle is the angle between the horizontal through the centre of the optic disc and the line from the disc centre to the fovea; it is positive when the fovea lies below that horizontal.',
  ]
  let earned = 0
  let possible = 0
  for (const eye of ['RE', 'LE'] as const) {
    const ref = input.references[eye]
    const given = input.marks[eye]
    if (!ref || !given) continue
    const referenceAngle = round1(discFoveaAngle(eye, ref.disc, ref.fovea))
    const measuredAngle = round1(discFoveaAngle(eye, given.disc, given.fovea))
    const expectedFinding = findingForAngle(eye, referenceAngle)
    const acceptedFindings = acceptableFindings(eye, referenceAngle)
    const marks = [
      angleMark(eye, measuredAngle, referenceAngle, tolerance),
      findingMark(eye, given.finding, acceptedFindings, expectedFinding, measuredAngle),
    ]
    const { notes, offsets } = placementNotes(eye, ref, given, input.approximate ?? false)
    for (const m of marks) {
      earned += m.score * m.weight
      possible += m.weight
    }
    const range = NORMAL_RANGES[eye]
    explanation.push(`${eye}: the picture shows ${deg(referenceAngle)}; the normal range is ${deg(range.low)} to ${deg(range.high)} (mean ${range.mean}° ± 2 × ${range.sd}°), so this is ${label(expectedFinding)}.`)
    eyes[eye] = { eye, measuredAngle, referenceAngle, finding: given.finding, expectedFinding, acceptedFindings, offsets, marks, notes }
  }
  explanation.push('Excyclotorsion increases the angle in both eyes (the fovea sits further below the disc centre); incyclotorsion decreases it, with the fovea level with or above the disc centre.')
  return {
    eyes,
    score: possible ? Math.round((earned / possible) * 1000) / 1000 : 0,
    points: { earned, possible },
    normalRanges: { RE: { ...NORMAL_RANGES.RE }, LE: { ...NORMAL_RANGES.LE } },
    explanation,
    sources: [FUNDUS_SOURCES.korean2005, FUNDUS_SOURCES.bixenman1982, FUNDUS_SOURCES.method2013, FUNDUS_SOURCES.range],
  }
}
