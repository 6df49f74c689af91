// Subjective against objective torsion on a case: what the double Maddox rod shows
// (the patient's report) beside what the fundus shows (the eye's position). They
// differ on purpose for long-standing palsies, where sensory adaptation removes the
// subjective torsion while the eye stays torted (von Noorden, Ophthalmology
// 1979;86:1451-61; domain.md §3.8). Builds on the engine's under-reporting note.

import { FUNDUS_SOURCES } from '#shared/engine/fundus/normals'
import type { FundusComparison } from '#shared/engine/fundus/result'
import type { Eye } from '#shared/engine/types'
import type { Case } from '../engine/types'
import type { FundusTruth } from './generate'

const signed = (t: number): string =>
  Math.abs(t) < 0.5 ? 'no torsion' : `${Math.abs(t).toFixed(1)}° ${t > 0 ? 'excyclo' : 'incyclo'}`

/** Objective minus subjective beyond this, degrees, counts as a mismatch worth explaining. */
const MISMATCH_FROM = 2

export function compareWithDmr(c: Case, truth: FundusTruth): FundusComparison {
  const f = c.gazes.primary
  const underReports = c.response.behaviours.includes('under-reports')
  const explanation: string[] = []
  const eyes: Eye[] = ['RE', 'LE']
  const gaps = eyes.filter(e => Math.abs(f.torsion[e] - f.reported[e]) >= MISMATCH_FROM)

  for (const e of eyes) {
    explanation.push(`${e}: the fundus shows a disc–fovea angle of ${truth.eyes[e].angle.toFixed(1)}°, from ${signed(f.torsion[e])} of the eye itself (on a normal angle of ${truth.eyes[e].normalAngle.toFixed(1)}°); the double Maddox rod shows ${signed(f.reported[e])}.`)
  }
  if (underReports) {
    explanation.push(
      'They disagree because this palsy is long-standing: the eye really is torted, as the fundus shows, but over time the brain has re-labelled the retinal meridians (sensory adaptation), so the patient sees the streaks level with little or no turn of the rod. The double Maddox rod measures what the patient perceives; the fundus photograph measures where the eye is.',
      'In such patients, record the double Maddox rod result as you measured it, and confirm torsion objectively with the disc–fovea angle. A palsy that shows fundus torsion without subjective torsion or complaints of tilt suggests a long-standing (often congenital) cause.',
    )
  }
  else if (gaps.length) {
    explanation.push(`The two measures differ by more than ${MISMATCH_FROM}° in ${gaps.join(' and ')}. Fundus photographs and the double Maddox rod often disagree in the same patient (Liebermann et al. 2021), so interpret them together with the history.`)
  }
  else {
    explanation.push('Here the two agree: the patient perceives the torsion the eyes have. Each measure still varies by a few degrees from one reading to the next.')
  }
  explanation.push(`Sources: ${FUNDUS_SOURCES.adaptation1979}; ${FUNDUS_SOURCES.comparison2021}.`)
  return {
    objectiveTorsion: { ...f.torsion },
    dmrTorsion: { ...f.reported },
    underReports,
    explanation,
  }
}
