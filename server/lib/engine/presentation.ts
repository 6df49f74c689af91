// toPresentation: the secrecy boundary. Builds the browser-facing view of a case
// (shared/engine/presentation.ts) and nothing more: no condition, template, signed
// torsion, direction label or expected record ever crosses it.

import { torsionToReading } from '#shared/engine/dial'
import { PRESENTATION_VERSION } from '#shared/engine/presentation'
import type { CoverTest, PositionView, Presentation, ResponseCues, StreakLook } from '#shared/engine/presentation'
import { round1 } from '#shared/engine/random'
import type { Gaze, Mode, PerEye } from '#shared/engine/types'
import { GAZES } from '#shared/engine/types'
import { specKey } from './generator'
import type { Case } from './types'

/** Red rod before the right eye, white before the left (common practice), told apart by pattern too. */
export const STREAK_LOOKS: PerEye<StreakLook> = {
  RE: { colour: 'red', pattern: 'solid' },
  LE: { colour: 'white', pattern: 'dashed' },
}

/** Scatter (SD, degrees) at and above which a patient answers coarsely. */
export const COARSE_FROM_SD = 1.5

/** Opaque key for the patient's words: a hash, so it never spells out the case. */
export const wordsKeyFor = (c: Case): string => specKey(`${c.generatorVersion}|${c.templateId ?? ''}|${c.seed}`).replace('spec-', 'w-')

export function responseCues(c: Case): ResponseCues {
  const b = c.response.behaviours
  const streaksSeen = b.includes('one-streak-only') ? 'one' : b.includes('intermittent-one-streak') ? 'intermittent' : 'both'
  const cues: ResponseCues = {
    reliability: c.response.reliabilitySd >= COARSE_FROM_SD ? 'coarse' : 'fine',
    threshold: c.response.parallelThreshold,
    streaksSeen,
  }
  if (streaksSeen !== 'both' && c.response.seenEye) cues.seenEye = c.response.seenEye
  return cues
}

/** Rod-axis reading at which each eye's streak looks level in a dim room, no prism. */
export const horizontalAtFor = (c: Case, gaze: Gaze): PerEye<number> => ({
  RE: round1(torsionToReading('RE', c.gazes[gaze].reported.RE)),
  LE: round1(torsionToReading('LE', c.gazes[gaze].reported.LE)),
})

const half = (v: number): number => Math.round(v * 2) / 2

function coverTest(c: Case): CoverTest | undefined {
  const verticals = [...GAZES.map(g => c.gazes[g].vertical), c.headTilt.right, c.headTilt.left]
  if (verticals.every(v => Math.abs(v) < 1)) return undefined
  return {
    gaze: Object.fromEntries(GAZES.map(g => [g, half(c.gazes[g].vertical)])) as Record<Gaze, number>,
    headTilt: { right: half(c.headTilt.right), left: half(c.headTilt.left) },
    supine: half(c.supine),
  }
}

export function toPresentation(c: Case, mode: Mode): Presentation {
  const positions = Object.fromEntries(
    GAZES.map((g): [Gaze, PositionView] => {
      const f = c.gazes[g]
      const view: PositionView = { alignment: { vertical: f.vertical, horizontal: { ...f.horizontal } } }
      if (mode === 'learner-turns') view.horizontalAt = horizontalAtFor(c, g)
      return [g, view]
    }),
  ) as Record<Gaze, PositionView>
  const p: Presentation = {
    presentationVersion: PRESENTATION_VERSION,
    generatorVersion: c.generatorVersion,
    mode,
    fixingEye: c.fixingEye,
    streaks: { RE: { ...STREAK_LOOKS.RE }, LE: { ...STREAK_LOOKS.LE } },
    response: responseCues(c),
    wordsKey: wordsKeyFor(c),
    opening: c.opening,
    positions,
  }
  const ct = coverTest(c)
  if (ct) p.coverTest = ct
  return p
}
