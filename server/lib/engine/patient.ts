// The virtual patient at the bench: what they see and say for a setting, and —
// in patient-turns mode — where they leave each rod when asked to make their line
// level (their own judgement, with their scatter, reproducible per trial).

import { effectiveHorizontalAt, settingForLevel } from '#shared/engine/optics'
import type { PatientTurnsResult } from '#shared/engine/presentation'
import { makeRng, normal, round1 } from '#shared/engine/random'
import type { Distance, Gaze, Lights, PerEye, Prism, PatientWords } from '#shared/engine/types'
import { mapEyes } from '#shared/engine/types'
import type { BenchSetting, PatientView, ViewSource } from '#shared/engine/view'
import { buildView } from '#shared/engine/view'
import { describeView } from '#shared/engine/words'
import { STREAK_LOOKS, horizontalAtFor, responseCues, wordsKeyFor } from './presentation'
import type { Case } from './types'

export function caseViewSource(c: Case, gaze: Gaze): ViewSource {
  const f = c.gazes[gaze]
  return {
    horizontalAt: horizontalAtFor(c, gaze),
    alignment: { vertical: f.vertical, horizontal: { ...f.horizontal } },
    fixingEye: c.fixingEye,
    streaks: STREAK_LOOKS,
    response: responseCues(c),
    wordsKey: wordsKeyFor(c),
  }
}

/** What the patient sees — the same computation the bench runs in the browser. */
export const patientView = (c: Case, setting: BenchSetting): PatientView => buildView(caseViewSource(c, setting.gaze), setting)

export const patientSays = (c: Case, setting: BenchSetting): PatientWords => describeView(patientView(c, setting))

/**
 * Where the patient's line looks level for this setting (prism artefact and room
 * lights included): the centre of their judgement before scatter.
 */
export function levelReadings(c: Case, gaze: Gaze, prisms: readonly Prism[], lights: Lights = 'dim'): PerEye<number> {
  const h = horizontalAtFor(c, gaze)
  return mapEyes(h, (v, eye) => settingForLevel(effectiveHorizontalAt(eye, v, prisms), lights))
}

export interface TurnRequest {
  gaze: Gaze
  distance: Distance
  prisms?: readonly Prism[]
  lights?: Lights
  /** 1, 2, 3… The same trial always gives the same setting. */
  trial: number
}

/**
 * Patient-turns mode: the patient turns each rod until its line looks level. Each
 * setting scatters by the patient's reliability SD, seeded by the trial so it can be
 * replayed. A rod whose line the patient cannot see stays where it started (90°).
 */
export function patientSetsRods(c: Case, req: TurnRequest): PatientTurnsResult {
  const prisms = req.prisms ?? []
  const lights = req.lights ?? 'dim'
  const centre = levelReadings(c, req.gaze, prisms, lights)
  const start = { gaze: req.gaze, distance: req.distance, readings: { RE: 90, LE: 90 }, prisms, lights }
  const before = patientView(c, start)
  const readings = mapEyes(centre, (v, eye) => {
    if (!before.streaks[eye].visible) return 90
    const rng = makeRng(`${wordsKeyFor(c)}|turn|${req.gaze}|${req.distance}|${req.trial}|${eye}`)
    // lines lying on top of each other are harder to judge: twice the scatter
    const sd = c.response.reliabilitySd * (before.overlap ? 2 : 1)
    return round1(normal(rng, v, sd))
  })
  // The patient stops turning where each line looks level *to them*: their
  // scatter is a misjudgement they cannot see, so they describe the lines as
  // level, not as the true geometry at the setting they chose would look.
  const believed = mapEyes(readings, (v, eye) => (before.streaks[eye].visible ? centre[eye] : v))
  const words = patientSays(c, { ...start, readings: believed })
  return { gaze: req.gaze, distance: req.distance, trial: req.trial, readings, words }
}
