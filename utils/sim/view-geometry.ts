// The patient's view as drawn on the bench: where each streak lies and at what
// tilt, in canvas pixels. The same drawing serves both modes; only the source of
// the tilt differs (live optics in learner-turns, the patient's report in
// patient-turns, where the browser does not hold the optics' inputs).

import { VISIBLE_FIELD, inView, streakOffsets, streaksOverlap } from '#shared/engine/optics'
import type { Presentation, PatientTurnsResult, StreakLook } from '#shared/engine/presentation'
import type { PatientView } from '#shared/engine/view'
import type { Observation, SlopeSize } from '#shared/engine/words'
import type { Eye, Lights, Offset, PerEye, Prism } from '#shared/engine/types'
import { EYES, mapEyes } from '#shared/engine/types'
import type { Point } from './frame-geometry'

export interface DrawnStreak extends StreakLook {
  eye: Eye
  /** Tilt as the patient perceives it, degrees anticlockwise in the patient's view. */
  angle: number
  /** Position in the patient's view, Δ (x to the patient's right, y up). */
  offset: Offset
  visible: boolean
}

export interface DrawnView {
  streaks: PerEye<DrawnStreak>
  lights: Lights
  overlap: boolean
  /** Where the drawing comes from, said under the panel. */
  source: 'live' | 'reported'
}

/** Width : height of the patient's view canvas: the visible field is 2·40 Δ by 2·20 Δ. */
export const VIEW_ASPECT = VISIBLE_FIELD.y / VISIBLE_FIELD.x

export function drawnFromView(view: PatientView): DrawnView {
  return {
    streaks: mapEyes(view.streaks, (s, eye) => ({
      eye,
      colour: s.colour,
      pattern: s.pattern,
      angle: s.perceivedAngle,
      offset: s.offset,
      visible: s.visible,
    })),
    lights: view.lights,
    overlap: view.overlap,
    source: 'live',
  }
}

/** Tilts drawn for the patient's words in patient-turns mode; Cyclodial's own choice. */
const REPORTED_TILT: Record<SlopeSize, number> = { slight: 2, clear: 6, steep: 12 }

/**
 * Patient-turns: the view as the patient described it after turning the rods.
 * Positions come from the misalignment and the prisms (both on screen anyway);
 * tilts come from the patient's words, never from the case.
 */
export function drawnFromReport(
  presentation: Presentation,
  turn: Pick<PatientTurnsResult, 'gaze' | 'distance' | 'words'>,
  prisms: readonly Prism[],
  lights: Lights,
): DrawnView {
  const alignment = presentation.positions[turn.gaze].alignment
  const offsets = streakOffsets(
    { vertical: alignment.vertical, horizontal: alignment.horizontal[turn.distance] },
    prisms,
    presentation.fixingEye,
  )
  const obs: Observation[] = turn.words.observations
  const hidden = new Set<Eye>()
  for (const o of obs) {
    if (o.kind === 'none-seen') EYES.forEach(e => hidden.add(e))
    if (o.kind === 'out-of-view') hidden.add(o.eye)
    if (o.kind === 'one-line') hidden.add(o.seen === 'RE' ? 'LE' : 'RE')
  }
  const angleFor = (eye: Eye): number => {
    const slope = obs.find(o => o.kind === 'slopes' && o.eye === eye)
    if (!slope || slope.kind !== 'slopes') return 0
    const size = REPORTED_TILT[slope.size]
    // an anticlockwise streak (positive angle) has its left end lower
    return slope.lowEnd === 'left' ? size : -size
  }
  return {
    streaks: mapEyes(presentation.streaks, (look, eye) => ({
      eye,
      ...look,
      angle: angleFor(eye),
      offset: offsets[eye],
      visible: !hidden.has(eye) && inView(offsets[eye]),
    })),
    lights,
    overlap: streaksOverlap(offsets),
    source: 'reported',
  }
}

export interface StreakSegment { from: Point, to: Point, centre: Point }

/** Pixels per prism dioptre for a canvas of the given width. */
export const pxPerDioptre = (width: number): number => width / (2 * VISIBLE_FIELD.x)

/** A streak as a long line across the canvas through its offset, at its perceived tilt. */
export function streakSegment(streak: Pick<DrawnStreak, 'angle' | 'offset'>, width: number, height: number): StreakSegment {
  const s = pxPerDioptre(width)
  const centre = { x: width / 2 + streak.offset.x * s, y: height / 2 - streak.offset.y * s }
  const rad = (streak.angle * Math.PI) / 180
  const half = width * 0.62
  // patient's view: anticlockwise is positive, canvas y runs down
  const dx = Math.cos(rad) * half
  const dy = -Math.sin(rad) * half
  return { centre, from: { x: centre.x - dx, y: centre.y - dy }, to: { x: centre.x + dx, y: centre.y + dy } }
}
