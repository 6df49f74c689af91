// Plain words for every criterion a mark can be given on: the written record, the
// three-step interpretation, quiz criteria and the fundus marker. One table, so every
// screen that shows marks names them the same way.
import { CRITERION_LABELS } from '#shared/schemas/quiz'
import type { Eye } from '#shared/engine/types'

const MORE: Record<string, string> = {
  'higher-eye': 'Step 1: higher eye',
  'worse-gaze': 'Step 2: worse gaze',
  'worse-tilt': 'Step 3: worse head tilt',
  'muscle': 'Palsied muscle',
  // the fundus marker grades each eye on these two
  'angle': 'Disc–fovea angle',
  'finding': 'Objective finding',
}

/** "Direction", "Disc–fovea angle"…; an unknown key reads as "Another criterion", never the key. */
export function criterionWords(criterion: string): string {
  return (CRITERION_LABELS as Record<string, string>)[criterion] ?? MORE[criterion] ?? 'Another criterion'
}

export const eyeWords = (eye: Eye | undefined | null): string => (eye === 'RE' ? 'right eye' : eye === 'LE' ? 'left eye' : '')

/** Points as people write them: whole numbers plain, otherwise up to two decimals. */
export const pointsText = (v: number): string => (Math.round(v * 100) / 100).toString()

/** A mark in words: full, half (or part), none. */
export function markWord(score: number): 'Full' | 'Half' | 'Part' | 'None' {
  if (score >= 1) return 'Full'
  if (score === 0.5) return 'Half'
  return score > 0 ? 'Part' : 'None'
}

/**
 * An attempt's slips on one line, each named once with its eye: "Direction reversed
 * (both eyes); Test not named". A slip the grader gave for both eyes reads "both eyes".
 */
export function slipsLine(slips: readonly { code: string, eye?: Eye }[], title: (code: string) => string): string {
  const eyes = new Map<string, Set<Eye | ''>>()
  for (const s of slips) {
    const set = eyes.get(s.code) ?? new Set<Eye | ''>()
    set.add(s.eye ?? '')
    eyes.set(s.code, set)
  }
  return [...eyes].map(([code, set]) => {
    const named = [...set].filter((e): e is Eye => e !== '')
    const which = named.length === 2 ? 'both eyes' : named.length === 1 ? eyeWords(named[0]) : ''
    return which ? `${title(code)} (${which})` : title(code)
  }).join('; ')
}
