// Seeded case generator (domain.md §4). The same template, seed and generator
// version give the same patient forever: store GENERATOR_VERSION with every case
// and bump it whenever a change here would alter a generated number.

import { caseSpecSchema } from '#shared/engine/case-spec'
import type { CaseSpec, CaseSpecParsed } from '#shared/engine/case-spec'
import { makeRng, round1, uniform } from '#shared/engine/random'
import type { Gaze, PerEye } from '#shared/engine/types'
import { GAZES } from '#shared/engine/types'
import type { CaseDraft } from './families'
import { draftFor } from './families'
import { mirrorCase } from './mirror'
import { openingWords } from './opening'
import type { CaseTemplate } from './templates'
import { getCaseTemplate } from './templates'
import type { Case, GazeFinding } from './types'

export const GENERATOR_VERSION = 1
export const SUPPORTED_GENERATOR_VERSIONS: readonly number[] = [1]

const roundEyes = (v: PerEye<number>): PerEye<number> => ({ RE: round1(v.RE), LE: round1(v.LE) })

function resolveTemplate(template: CaseTemplate | string): CaseTemplate {
  if (typeof template !== 'string') return template
  const t = getCaseTemplate(template)
  if (!t) throw new Error(`Unknown case template "${template}".`)
  return t
}

/**
 * Generate a case. Mirror-image templates (…-right / …-left) share a family and
 * drawInRange identical numbers, so the left case is the exact mirror of the right one.
 */
export function generateCase(template: CaseTemplate | string, seed: string, version: number = GENERATOR_VERSION): Case {
  if (!SUPPORTED_GENERATOR_VERSIONS.includes(version)) {
    throw new Error(`Generator version ${version} is not available (this build makes version ${GENERATOR_VERSION}).`)
  }
  const t = resolveTemplate(template)
  const rng = makeRng(`cyclodial/v${version}/${t.family}/${t.difficulty}/${seed}`)
  // the side is drawn first so it never shifts the other numbers
  const sideDraw = rng()
  const draft = draftFor(rng, t)
  const reliabilitySd = uniform(rng, t.ranges.reliabilitySd[0], t.ranges.reliabilitySd[1])
  const parallelThreshold = uniform(rng, t.ranges.parallelThreshold[0], t.ranges.parallelThreshold[1])
  const opening = openingWords(rng, draft, t.condition)
  const canonical = fromDraft(draft, {
    generatorVersion: version,
    seed,
    templateId: t.id,
    condition: t.condition,
    difficulty: t.difficulty,
    label: t.label,
    sources: [...t.sources],
    opening,
    reliabilitySd,
    parallelThreshold,
  })
  const left = t.side === 'LE' || (t.sideFromSeed && sideDraw >= 0.5)
  return left ? mirrorCase(canonical) : canonical
}

interface Meta {
  generatorVersion: number
  seed: string
  templateId: string | null
  condition: Case['condition']
  difficulty: Case['difficulty']
  label: string
  sources: string[]
  opening: string
  reliabilitySd: number
  parallelThreshold: number
}

function fromDraft(d: CaseDraft, m: Meta): Case {
  const gazes = Object.fromEntries(
    GAZES.map((g): [Gaze, GazeFinding] => [
      g,
      {
        torsion: roundEyes(d.torsion[g]),
        reported: roundEyes(d.reported[g]),
        vertical: round1(d.vertical.gazes[g]),
        horizontal: { near: round1(d.horizontal[g].near), distance: round1(d.horizontal[g].distance) },
      },
    ]),
  ) as Record<Gaze, GazeFinding>
  const response: Case['response'] = {
    reliabilitySd: round1(m.reliabilitySd),
    parallelThreshold: round1(m.parallelThreshold),
    behaviours: [...d.behaviours],
  }
  if (d.seenEye) response.seenEye = d.seenEye
  return {
    generatorVersion: m.generatorVersion,
    seed: m.seed,
    templateId: m.templateId,
    condition: m.condition,
    difficulty: m.difficulty,
    label: m.label,
    affectedEye: d.affectedEye,
    palsiedMuscles: [...d.muscles],
    fixingEye: d.fixingEye,
    gazes,
    headTilt: { right: round1(d.vertical.headTilt.right), left: round1(d.vertical.headTilt.left) },
    supine: round1(d.vertical.supine),
    response,
    opening: m.opening,
    sources: m.sources,
  }
}

// ---- hand-authored cases ----------------------------------------------------

export interface SpecIssue {
  path: string
  message: string
}

export type SpecResult = { ok: true, case: Case } | { ok: false, issues: SpecIssue[] }

/** A short stable key for a hand-authored case (FNV-1a of its JSON). */
export function specKey(spec: unknown): string {
  let h = 0x811c9dc5
  for (const ch of JSON.stringify(spec)) {
    h ^= ch.codePointAt(0)!
    h = Math.imul(h, 0x01000193) >>> 0
  }
  return `spec-${h.toString(16).padStart(8, '0')}`
}

/**
 * Build a case from a tutor's exact numbers, through the same shape as a generated
 * case. Positions of gaze not given copy primary position (a comitant finding).
 */
export function caseFromSpec(input: CaseSpec | unknown): SpecResult {
  const parsed = caseSpecSchema.safeParse(input)
  if (!parsed.success) {
    return {
      ok: false,
      issues: parsed.error.issues.map(i => ({ path: i.path.join('.'), message: i.message })),
    }
  }
  return { ok: true, case: buildFromSpec(parsed.data, specKey(input)) }
}

function buildFromSpec(s: CaseSpecParsed, key: string): Case {
  const primary = s.gazes.primary!
  const finding = (g: Gaze): GazeFinding => {
    const f = s.gazes[g] ?? primary
    const horizontal = typeof f.horizontal === 'number' ? { near: f.horizontal, distance: f.horizontal } : f.horizontal
    return { torsion: { ...f.torsion }, reported: { ...(f.reported ?? f.torsion) }, vertical: f.vertical, horizontal: { ...horizontal } }
  }
  const gazes = Object.fromEntries(GAZES.map(g => [g, finding(g)])) as Record<Gaze, GazeFinding>
  const v0 = gazes.primary.vertical
  const response: Case['response'] = {
    reliabilitySd: s.response.reliabilitySd,
    parallelThreshold: s.response.parallelThreshold,
    behaviours: [...s.response.behaviours],
  }
  if (s.response.seenEye) response.seenEye = s.response.seenEye
  return {
    generatorVersion: GENERATOR_VERSION,
    seed: key,
    templateId: null,
    condition: s.condition,
    difficulty: null,
    label: s.label ?? 'Hand-authored case',
    affectedEye: s.affectedEye ?? null,
    palsiedMuscles: [...s.palsiedMuscles],
    fixingEye: s.fixingEye,
    gazes,
    headTilt: s.headTilt ?? { right: v0, left: v0 },
    supine: s.supine ?? v0,
    response,
    opening: s.opening ?? 'I\'ve been asked to come in for an eye-movement check.',
    sources: ['Hand-authored by a tutor'],
  }
}
