// Grading a learner's attempt on a case, and what the learner may see afterwards.

import { hasDirection } from '#shared/engine/marking'
import { netVerticalPrism, prismInducedExcyclo } from '#shared/engine/optics'
import type { InterpretationBody } from '#shared/engine/schemas'
import type { Distance, Gaze, Lights, Mode, Muscle, PerEye, Prism, RecordedDirection } from '#shared/engine/types'
import { mapEyes } from '#shared/engine/types'
import type { GradeOptions, GradeResult } from './grader'
import { gradeRecord } from './grader'
import { NOT_PERFORMED_RECORD, modelRecord } from './model-record'
import { levelReadings, patientSetsRods } from './patient'
import { horizontalAtFor } from './presentation'
import type { InterpretationResult } from './three-step'
import { gradeInterpretation } from './three-step'
import { fundusPointer } from '~~/server/lib/fundus/compare'
import type { Case, Condition } from './types'

export interface AttemptInput {
  gaze: Gaze
  distance: Distance
  /** The learner's dial readings (rod axis): set by them, or read off where the patient left the rods. */
  readings: PerEye<number>
  prisms?: readonly Prism[]
  lights?: Lights
  record: string
  interpretation?: InterpretationBody
}

export interface AttemptContext {
  mode: Mode
  /** Patient-turns: which trial the learner read the rods on (default 1). */
  trial?: number
  options?: GradeOptions
}

/** The answer, revealed in practice once an attempt is in (never inside a presentation). */
export interface CaseTruth {
  label: string
  condition: Condition
  gaze: Gaze
  /** Torsion the double Maddox rod shows in this position (what the record should say). */
  torsion: PerEye<number>
  /** The eye's objective torsion (a fundus photograph would show it). */
  objectiveTorsion: PerEye<number>
  directions: PerEye<RecordedDirection>
  /** Rod-axis readings at which each line looks level, no prism, dim room. */
  levelAt: PerEye<number>
  palsiedMuscles: Muscle[]
  modelRecord: string
  sources: string[]
}

export interface AttemptGrade extends GradeResult {
  interpretation?: InterpretationResult
  truth: CaseTruth
}

export const mustNotTest = (c: Case): boolean =>
  c.response.behaviours.includes('one-streak-only') || c.response.behaviours.includes('intermittent-one-streak')

export function revealTruth(c: Case, gaze: Gaze, distance?: Distance, tolerance?: number): CaseTruth {
  const f = c.gazes[gaze]
  return {
    label: c.label,
    condition: c.condition,
    gaze,
    torsion: { ...f.reported },
    objectiveTorsion: { ...f.torsion },
    directions: mapEyes(f.reported, t => (!hasDirection(t) ? 'none' : t > 0 ? 'excyclo' : 'incyclo')),
    levelAt: horizontalAtFor(c, gaze),
    palsiedMuscles: [...c.palsiedMuscles],
    modelRecord: mustNotTest(c) ? NOT_PERFORMED_RECORD : modelRecord({ torsion: f.reported, gaze, distance, tolerance }),
    sources: [...c.sources],
  }
}

/**
 * Grade an attempt. Learner-turns: the measurement mark asks whether the learner's
 * own setting is where each line looks level (prism artefact included). Patient-turns:
 * the patient set the rods, so the measurement mark asks whether the learner read the
 * scale where the patient left them; direction and amount accept either the case's
 * finding or what this trial showed.
 */
export function gradeAttempt(c: Case, a: AttemptInput, ctx: AttemptContext): AttemptGrade {
  const prisms = a.prisms ?? []
  const expected = c.gazes[a.gaze].reported
  const tolerance = ctx.options?.tolerance
  const base = {
    record: a.record,
    expected,
    gaze: a.gaze,
    distance: a.distance,
    readings: a.readings,
    shouldNotTest: mustNotTest(c),
    options: ctx.options,
  }
  const result
    = ctx.mode === 'patient-turns'
      ? gradeRecord({
          ...base,
          patientSettings: patientSetsRods(c, { gaze: a.gaze, distance: a.distance, prisms, lights: a.lights, trial: ctx.trial ?? 1 }).readings,
        })
      : gradeRecord({ ...base, levelAt: levelReadings(c, a.gaze, prisms, 'dim') })

  const notes: string[] = []
  const artefact = prismInducedExcyclo(netVerticalPrism(prisms))
  if (artefact >= 1) {
    notes.push(`The ${Math.round(netVerticalPrism(prisms))}Δ separating prism adds about ${artefact.toFixed(1)}° of apparent excyclotorsion in total, even in people with no torsion; a smaller prism keeps that error down.`)
  }
  if (a.lights === 'on') notes.push('The room lights were on: the room gives orientation cues that pull the lines towards level. Dim the room.')
  if (c.response.behaviours.includes('under-reports')) {
    const f = c.gazes[a.gaze]
    notes.push(
      `This patient adapted long ago: the eyes are actually RE ${f.torsion.RE.toFixed(1)}°, LE ${f.torsion.LE.toFixed(1)}° (positive = excyclo), but the double Maddox rod shows little. ${fundusPointer(c)}`,
    )
  }
  notes.push('Repeat readings vary by a few degrees; between visits a change under 5° may not be real.')

  const out: AttemptGrade = {
    ...result,
    explanation: [...result.explanation, ...notes],
    truth: revealTruth(c, a.gaze, a.distance, tolerance),
  }
  if (a.interpretation) out.interpretation = gradeInterpretation(c, a.interpretation)
  return out
}

export interface KnownFindingInput {
  torsion: PerEye<number>
  gaze?: Gaze
  distance?: Distance
  readings?: Partial<PerEye<number>>
  record: string
  tolerance?: number
}

/** The record checker: grade a written record against a known finding (no case needed). */
export function gradeKnownFinding(input: KnownFindingInput, options?: Omit<GradeOptions, 'tolerance'>): GradeResult {
  return gradeRecord({
    record: input.record,
    expected: input.torsion,
    gaze: input.gaze,
    distance: input.distance,
    readings: input.readings,
    options: { ...options, tolerance: input.tolerance },
  })
}
