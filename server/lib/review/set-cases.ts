// Choosing the cases of a targeted practice set: cases that exercise the slip
// the learner makes. A left-eye rule swap gets cases with clear left-eye
// torsion, half excyclo and half incyclo, where the right eye is clearly torted
// too — only there does a reversed left eye show the swap rather than recording
// the image (domain.md §5.3); a direction reversal gets an even mix
// of excyclo and incyclo; and so on. Cases are drawn deterministically from the
// set and learner (keyed with the server's secret, see hidden-case.ts), so a set
// can be rebuilt, and each learner gets their own.
import type { Eye, Mode } from '#shared/engine/types'
import { EYES } from '#shared/engine/types'
import type { PatternCode } from '#shared/review/patterns'
import { generateCase } from '~~/server/lib/engine/generator'
import { CASE_TEMPLATES } from '~~/server/lib/engine/templates'
import { hiddenCaseSeed } from '~~/server/lib/practice/hidden-case'
import type { Case } from '~~/server/lib/engine/types'

/** Torsion this clear of zero cannot be read as "no torsion" within the default 2° tolerance. */
export const CLEAR_TORSION = 3

// Cases where the double Maddox rod should not be recorded, or shows little, teach something else.
const SKIP = new Set(['normal', 'suppression', 'long-standing-so-palsy'])
const POOL = CASE_TEMPLATES.filter(t => !SKIP.has(t.condition))

type Kind = 'excyclo' | 'incyclo'
const dir = (t: number): Kind => (t > 0 ? 'excyclo' : 'incyclo')

/** Which quota a case fills for this focus, or null when it does not exercise the slip. */
function classify(c: Case, focus: PatternCode, eye?: Eye): Kind | null {
  const t = c.gazes.primary.reported
  if (focus === 'left-right-rule-swapped' && eye) {
    const other: Eye = eye === 'RE' ? 'LE' : 'RE'
    return Math.abs(t[eye]) >= CLEAR_TORSION && Math.abs(t[other]) >= CLEAR_TORSION ? dir(t[eye]) : null
  }
  const clear = EYES.filter(e => Math.abs(t[e]) >= CLEAR_TORSION)
  if (!clear.length) return null
  const main = clear.reduce((a, b) => (Math.abs(t[a]) >= Math.abs(t[b]) ? a : b))
  return dir(t[main])
}

export function modeForFocus(focus: PatternCode): Mode {
  // the patient turns the rods, so the learner's task is reading and recording
  return focus === 'records-not-measures' ? 'patient-turns' : 'learner-turns'
}

export interface ChosenCase { templateId: string, seed: string, condition: string, difficulty: string, kind: Kind }

/** `size` cases for one learner: half excyclo, half incyclo (in the named eye for a rule swap). */
export function chooseSetCases(setId: number, learnerId: number, focus: PatternCode, size: number, eye?: Eye): ChosenCase[] {
  const want: Record<Kind, number> = { excyclo: Math.ceil(size / 2), incyclo: Math.floor(size / 2) }
  const chosen: ChosenCase[] = []
  const usedTemplates = new Map<string, number>()
  // few templates torte both eyes clearly (and only skew deviation gives an incyclotorted
  // eye beside a torted fellow), so a rule-swap set is not held to a share per template
  const perTemplate = focus === 'left-right-rule-swapped' ? size : Math.max(1, Math.ceil(size / 4))
  for (let k = 0; k < 2000 && chosen.length < size; k++) {
    // walk the pool so the set mixes conditions, least-used template first
    const template = POOL[(k * 7 + learnerId) % POOL.length]!
    if ((usedTemplates.get(template.id) ?? 0) >= perTemplate) continue
    // keyed with the server's secret: the learner knows the set, their id and k
    const seed = hiddenCaseSeed(`set${setId}-l${learnerId}-${k}`)
    const c = generateCase(template, seed)
    const kind = classify(c, focus, eye)
    if (!kind || want[kind] <= 0) continue
    want[kind] -= 1
    usedTemplates.set(template.id, (usedTemplates.get(template.id) ?? 0) + 1)
    chosen.push({ templateId: template.id, seed, condition: c.condition, difficulty: c.difficulty ?? 'standard', kind })
  }
  // alternate the directions, so the learner cannot settle into one answer
  const ex = chosen.filter(c => c.kind === 'excyclo')
  const inc = chosen.filter(c => c.kind === 'incyclo')
  const mixed: ChosenCase[] = []
  while (ex.length || inc.length) {
    if (ex.length) mixed.push(ex.shift()!)
    if (inc.length) mixed.push(inc.shift()!)
  }
  return mixed
}
