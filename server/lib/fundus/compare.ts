// Subjective against objective torsion on a case: what the double Maddox rod shows
// (the patient's report) beside what the fundus shows (the eye's position). They
// differ on purpose for long-standing palsies, where sensory adaptation removes the
// subjective torsion while the eye stays torted (von Noorden, Ophthalmology
// 1979;86:1451-61; domain.md §3.8). Builds on the engine's under-reporting note.
//
// The explanation agrees with the grade (gradeFundus): it reads each picture's angle
// against the same normal range (findingForAngle). Where a torted eye's angle is
// larger but still inside the range, it says so and teaches the comparison with the
// fellow eye (more than 4° between the eyes is probably abnormal: Madigan & Katz,
// J Pediatr Ophthalmol Strabismus 1992;29(3):171-4) and with what the patient
// reports; it never says the fundus shows the torsion then (domain.md §6).

import { FUNDUS_SOURCES, INTER_EYE_DIFFERENCE_ABNORMAL, NORMAL_RANGES, acceptableFindings, findingForAngle } from '#shared/engine/fundus/normals'
import type { FundusComparison } from '#shared/engine/fundus/result'
import type { Eye, PerEye } from '#shared/engine/types'
import type { Case } from '~~/server/lib/engine/types'
import type { FundusTruth } from './generate'
import { fundusForCase } from './generate'

const signed = (t: number): string =>
  Math.abs(t) < 0.5 ? 'no torsion' : `${Math.abs(t).toFixed(1)}° ${t > 0 ? 'excyclo' : 'incyclo'}`
const deg = (v: number): string => `${v.toFixed(1)}°`
const eyeName = (e: Eye): string => (e === 'RE' ? 'right eye' : 'left eye')
const otherEye = (e: Eye): Eye => (e === 'RE' ? 'LE' : 'RE')
const rangeText = (e: Eye): string => `${deg(NORMAL_RANGES[e].low)} to ${deg(NORMAL_RANGES[e].high)}`

/** Objective minus subjective beyond this, degrees, counts as a mismatch worth explaining. */
const MISMATCH_FROM = 2

/** Where an angle sits against the normal range, in the grade's own terms. */
function placeOf(e: Eye, angle: number): string {
  const finding = findingForAngle(e, angle)
  const nearLimit = acceptableFindings(e, angle).length > 1 ? ', within a degree of its limit' : ''
  if (finding === 'excyclo') return `above the normal range of ${rangeText(e)}${nearLimit} (excyclotorsion)`
  if (finding === 'incyclo') return `below the normal range of ${rangeText(e)}${nearLimit} (incyclotorsion)`
  return `inside the normal range of ${rangeText(e)}${nearLimit}`
}

/** The eye whose report falls furthest short of its objective torsion. */
function adaptedEye(c: Case, objective: PerEye<number>): Eye {
  if (c.affectedEye) return c.affectedEye
  const f = c.gazes.primary
  const gap = (e: Eye) => Math.abs(objective[e] - f.reported[e])
  return gap('LE') > gap('RE') ? 'LE' : 'RE'
}

function underReportingLines(c: Case, truth: FundusTruth, objective: PerEye<number>): string[] {
  const f = c.gazes.primary
  const eye = adaptedEye(c, objective)
  const fellow = otherEye(eye)
  const a = truth.eyes[eye].angle
  const b = truth.eyes[fellow].angle
  const torsion = objective[eye]
  const finding = findingForAngle(eye, a)
  const shows = (finding === 'excyclo' && torsion > 0) || (finding === 'incyclo' && torsion < 0)
  const lines: string[] = []
  if (shows) {
    lines.push(
      `They disagree because this palsy is long-standing: the ${eyeName(eye)} really is torted — its disc–fovea angle of ${deg(a)} lies ${finding === 'excyclo' ? 'above' : 'below'} the normal range, so here the fundus shows the torsion — but over time the brain has re-labelled the retinal meridians (sensory adaptation), so the patient sees the streaks level with little or no turn of the rod. The double Maddox rod measures what the patient perceives; the fundus photograph measures where the eye is.`,
      'In such patients, record the double Maddox rod result as you measured it, and confirm torsion objectively with the disc–fovea angle. A palsy that shows fundus torsion without subjective torsion or complaints of tilt suggests a long-standing (often congenital) cause.',
    )
    return lines
  }
  // measured in the direction of the eye's torsion: larger for excyclo, smaller for incyclo
  const sense = torsion >= 0 ? 1 : -1
  const more = sense > 0 ? 'larger' : 'smaller'
  const diff = (a - b) * sense
  const comparison = diff > INTER_EYE_DIFFERENCE_ABNORMAL
    ? `the ${eyeName(eye)}'s angle is ${deg(diff)} ${more} than the ${eyeName(fellow)}'s ${deg(b)}: a difference of more than ${INTER_EYE_DIFFERENCE_ABNORMAL}° between the two eyes is probably abnormal (Madigan & Katz 1992), so the comparison points to ${sense > 0 ? 'excyclotorsion' : 'incyclotorsion'} of the ${eyeName(eye)}.`
    : diff > 0
      ? `the ${eyeName(eye)}'s angle is ${deg(diff)} ${more} than the ${eyeName(fellow)}'s ${deg(b)}, but a difference of up to about ${INTER_EYE_DIFFERENCE_ABNORMAL}° can be found between two normal eyes (Madigan & Katz 1992), so here the photograph alone cannot confirm the torsion.`
      : `the ${eyeName(eye)}'s angle is not ${more} than the ${eyeName(fellow)}'s ${deg(b)}, so here the photograph cannot confirm the torsion at all.`
  lines.push(
    `This palsy is long-standing and the ${eyeName(eye)} is torted (${signed(torsion)}), yet its disc–fovea angle of ${deg(a)}, though ${more} than its own normal angle, is still inside the normal range (${rangeText(eye)}): on its own the photograph is within the normal range, and the grade says so. Normal angles spread widely, so an eye that started with a small angle can be torted and still sit inside the range.`,
    `Compare, then. With the fellow eye: ${comparison} In published series the paretic eye's angle averages 12.19° against 6.71° in the fellow eye (Kang et al. 2020). With what the patient reports: the double Maddox rod shows ${signed(f.reported[eye])} for the ${eyeName(eye)}, although the eye is torted; little or no reported torsion or tilt with such a palsy is the pattern of long-standing adaptation (sensory adaptation: the brain has re-labelled the retinal meridians).`,
    'Record the double Maddox rod result as you measured it, record the disc–fovea angles of both eyes, and say in your notes that the objective torsion rests on the comparison between the eyes, not on one angle outside the normal range.',
  )
  return lines
}

export function compareWithDmr(c: Case, truth: FundusTruth): FundusComparison {
  const f = c.gazes.primary
  const underReports = c.response.behaviours.includes('under-reports')
  const explanation: string[] = []
  const eyes: Eye[] = ['RE', 'LE']
  // what the fundus is turned by: a healthy eye's small subjective excyclo is not a rotation (version 2)
  const objective: PerEye<number> = { RE: truth.eyes.RE.torsion, LE: truth.eyes.LE.torsion }
  const gaps = eyes.filter(e => !truth.eyes[e].healthy && Math.abs(objective[e] - f.reported[e]) >= MISMATCH_FROM)

  for (const e of eyes) {
    const t = truth.eyes[e]
    const cause = t.healthy
      ? Math.abs(f.reported[e]) < 0.5
        ? 'a normal angle: this eye is not torted'
        : `a normal angle: this eye is not torted (the ${signed(f.reported[e])} it shows on the double Maddox rod is the small excyclo healthy eyes report, a perception rather than a turn of the eye: Flodin et al. 2020)`
      : `from ${signed(t.torsion)} of the eye itself (on a normal angle of ${deg(t.normalAngle)})`
    explanation.push(`${e}: the fundus shows a disc–fovea angle of ${deg(t.angle)}, ${placeOf(e, t.angle)}, ${cause}; the double Maddox rod shows ${signed(f.reported[e])}.`)
  }
  const sources: string[] = [FUNDUS_SOURCES.adaptation1979, FUNDUS_SOURCES.comparison2021]
  if (underReports) {
    explanation.push(...underReportingLines(c, truth, objective))
    sources.push(FUNDUS_SOURCES.kang2020, FUNDUS_SOURCES.interEye1992)
  }
  else if (gaps.length) {
    explanation.push(`The two measures differ by more than ${MISMATCH_FROM}° in ${gaps.join(' and ')}. Fundus photographs and the double Maddox rod often disagree in the same patient (Liebermann et al. 2021), so interpret them together with the history.`)
  }
  else if (eyes.every(e => truth.eyes[e].healthy)) {
    explanation.push('Both eyes are healthy: their fundus angles are normal, and the small excyclo a healthy eye may show on the double Maddox rod is a perception, not a turn of the eye. Each measure still varies by a few degrees from one reading to the next.')
  }
  else {
    explanation.push('Here the two agree: the patient perceives the torsion the eyes have. Each measure still varies by a few degrees from one reading to the next.')
  }
  if (eyes.some(e => truth.eyes[e].healthy)) sources.push(FUNDUS_SOURCES.flodin2020)
  explanation.push(`Sources: ${sources.join('; ')}.`)
  return {
    objectiveTorsion: objective,
    dmrTorsion: { ...f.reported },
    underReports,
    explanation,
  }
}

/**
 * The double Maddox rod feedback's pointer to the fundus for a patient who
 * under-reports: what the case's fundus picture (current version) shows, in the
 * grade's terms, without the angle itself (the learner measures that on the fundus page).
 */
export function fundusPointer(c: Case): string {
  const truth = fundusForCase(c)
  const objective: PerEye<number> = { RE: truth.eyes.RE.torsion, LE: truth.eyes.LE.torsion }
  const eye = adaptedEye(c, objective)
  const finding = findingForAngle(eye, truth.eyes[eye].angle)
  const torsion = objective[eye]
  if ((finding === 'excyclo' && torsion > 0) || (finding === 'incyclo' && torsion < 0)) {
    return `A fundus photograph shows the torsion: the ${eyeName(eye)}'s disc–fovea angle lies ${finding === 'excyclo' ? 'above' : 'below'} the normal range.`
  }
  return `On a fundus photograph the ${eyeName(eye)}'s disc–fovea angle is still inside the normal range, so the photograph alone does not show the torsion: compare it with the ${eyeName(otherEye(eye))}'s angle and with what the patient reports.`
}
