// Turns a bench setting (dials, prisms, gaze, lights) into what the patient sees.
// Pure and browser-safe so the bench can update the patient's view while a dial
// is dragged; the server builds the same view from the case for patient-turns mode.

import { wrapAxisDifference } from './dial'
import {
  effectiveHorizontalAt,
  inView,
  perceivedFromHorizontalAt,
  streakOffsets,
  streaksOverlap,
} from './optics'
import type { Presentation, ResponseCues, StreakLook } from './presentation'
import { makeRng } from './random'
import type { Distance, Eye, Gaze, Lights, Offset, PerDistance, PerEye, Prism } from './types'
import { EYES, mapEyes } from './types'

export interface BenchSetting {
  gaze: Gaze
  distance: Distance
  /** Rod-axis readings (ISO 8429) of the two dials. */
  readings: PerEye<number>
  prisms: readonly Prism[]
  lights: Lights
}

/** What a view needs, whether it comes from a presentation or from the case. */
export interface ViewSource {
  horizontalAt: PerEye<number>
  alignment: { vertical: number, horizontal: PerDistance<number> }
  fixingEye: Eye
  streaks: PerEye<StreakLook>
  response: ResponseCues
  wordsKey: string
}

export interface SeenStreak extends StreakLook {
  /** Angle of the streak as the patient perceives it; 0 = level, + = counter-clockwise. */
  perceivedAngle: number
  /** Position in the patient's view, Δ. */
  offset: Offset
  /** False when out of the field or not seen (suppression). */
  visible: boolean
  /** True when the streak would be in the field but the patient does not see it. */
  suppressed: boolean
}

export interface PatientView {
  streaks: PerEye<SeenStreak>
  overlap: boolean
  response: ResponseCues
  lights: Lights
  /** Key for the seeded choice of words; stable for the same setting. */
  wordsKey: string
}

/** Stable key of a setting, rounded to whole degrees so words do not flicker while dragging. */
export function settingKey(setting: BenchSetting): string {
  const prisms = setting.prisms.map(p => `${p.eye}${p.base}${p.power}`).join(',')
  return [
    setting.gaze,
    setting.distance,
    Math.round(setting.readings.RE),
    Math.round(setting.readings.LE),
    prisms,
    setting.lights,
  ].join('|')
}

function isSuppressed(source: ViewSource, eye: Eye, setting: BenchSetting): boolean {
  const { streaksSeen, seenEye } = source.response
  if (streaksSeen === 'both' || seenEye === undefined || eye === seenEye) return false
  if (streaksSeen === 'one') return true
  // intermittent: the streak comes and goes, the same way for the same setting
  return makeRng(`${source.wordsKey}|flicker|${settingKey(setting)}`)() < 0.5
}

export function buildView(source: ViewSource, setting: BenchSetting): PatientView {
  const deviation = {
    vertical: source.alignment.vertical,
    horizontal: source.alignment.horizontal[setting.distance],
  }
  const offsets = streakOffsets(deviation, setting.prisms, source.fixingEye)
  const streaks = mapEyes(source.streaks, (look, eye): SeenStreak => {
    const h = effectiveHorizontalAt(eye, source.horizontalAt[eye], setting.prisms)
    const suppressed = isSuppressed(source, eye, setting)
    const offset = offsets[eye]
    return {
      ...look,
      perceivedAngle: perceivedFromHorizontalAt(h, setting.readings[eye], setting.lights),
      offset,
      visible: inView(offset) && !suppressed,
      suppressed,
    }
  })
  return {
    streaks,
    overlap: streaksOverlap(offsets),
    response: source.response,
    lights: setting.lights,
    wordsKey: `${source.wordsKey}|${settingKey(setting)}`,
  }
}

/** Learner-turns mode: the bench builds the view from the presentation alone. */
export function viewFromPresentation(presentation: Presentation, setting: BenchSetting): PatientView {
  const position = presentation.positions[setting.gaze]
  if (!position.horizontalAt) {
    throw new Error('This presentation has no dial cues: in patient-turns mode the server builds the view.')
  }
  return buildView(
    {
      horizontalAt: position.horizontalAt,
      alignment: position.alignment,
      fixingEye: presentation.fixingEye,
      streaks: presentation.streaks,
      response: presentation.response,
      wordsKey: presentation.wordsKey,
    },
    setting,
  )
}

/** Relative tilt between the two perceived streaks (RE minus LE). */
export const relativeTilt = (view: PatientView): number =>
  wrapAxisDifference(view.streaks.RE.perceivedAngle - view.streaks.LE.perceivedAngle)

export const visibleEyes = (view: PatientView): Eye[] => EYES.filter(e => view.streaks[e].visible)
