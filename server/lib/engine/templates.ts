// Case templates: one per condition of domain.md §4, each at two difficulties.
// Ranges are the published figures named in `sources` (see sources.ts); where a
// range is Cyclodial's own choice the template says so.

import type { Difficulty, Eye } from '#shared/engine/types'
import type { Condition } from './types'
import { TEMPLATE_SOURCES as S } from './sources'

export type NumberRange = readonly [number, number]

export interface TemplateRanges {
  /** Primary-position torsion drawn by the template, degrees; `torsionOf` says of what. */
  torsion: NumberRange
  torsionOf: 'each-eye' | 'affected-eye' | 'total' | 'objective-affected-eye' | 'hyper-and-hypo-eye'
  /** Extra torsion in the field of action, as a fraction of the primary value. */
  fieldGain: NumberRange
  /** Magnitude of the vertical deviation in primary position, Δ. */
  vertical: NumberRange
  horizontal: { near: NumberRange, distance: NumberRange }
  reliabilitySd: NumberRange
  parallelThreshold: NumberRange
  /** Share of the objective torsion an adapted patient reports. */
  reportedShare?: NumberRange
  /** Subjective excyclo reported in the fellow (non-paretic) eye. */
  fellowReported?: NumberRange
}

export interface CaseTemplate {
  /** Stable id, e.g. `so-palsy-right-standard`. */
  id: string
  /** Shared by mirror-image templates so they drawInRange the same numbers. */
  family: Condition
  condition: Condition
  /** Affected eye when fixed by the template; null = none, or drawn from the seed (`sideFromSeed`). */
  side: Eye | null
  sideFromSeed: boolean
  difficulty: Difficulty
  /** For tutors only (never sent to a learner before results are released). */
  label: string
  sources: string[]
  ranges: TemplateRanges
}

// Response behaviour: SD 0.5–3° (domain §4); a coarse patient's scatter reaches the
// published test–retest spread (±4.7° LoA ≈ SD 2.4° of a difference).
const FINE = { reliabilitySd: [0.5, 1.5] as NumberRange, parallelThreshold: [0.5, 1.5] as NumberRange }
const COARSE = { reliabilitySd: [1.5, 3] as NumberRange, parallelThreshold: [1.5, 2.5] as NumberRange }
const SMALL_EXO = { near: [-6, 0] as NumberRange, distance: [-2, 1] as NumberRange }

const RESPONSE_SOURCES = [S.liebermann2018, S.marsh2014]

type CaseDraft = Omit<CaseTemplate, 'id' | 'sideFromSeed'> & { sideFromSeed?: boolean }

function t(idBase: string, d: CaseDraft): CaseTemplate {
  return { ...d, id: `${idBase}-${d.difficulty}`, sideFromSeed: d.sideFromSeed ?? false, sources: [...d.sources, ...RESPONSE_SOURCES] }
}

const sided = (idBase: string, make: (side: Eye, sideWord: string) => CaseDraft): CaseTemplate[] => [
  t(`${idBase}-right`, make('RE', 'right')),
  t(`${idBase}-left`, make('LE', 'left')),
]

const soPalsy = (difficulty: Difficulty) =>
  sided('so-palsy', (side, word) => ({
    family: 'so-palsy',
    condition: 'so-palsy',
    side,
    difficulty,
    label: `Acquired ${word} superior oblique palsy (${difficulty})`,
    sources: [S.domain, S.lee2013, S.almog2014, S.korean2016, S.jpos1993, S.parks1958, S.flodin2020],
    ranges: {
      // typically 3–8° (means 5–7° in published series); challenging = the smaller end
      torsion: difficulty === 'standard' ? [4, 8] : [3, 5],
      torsionOf: 'affected-eye',
      // 3.40° → 4.16° from primary to downgaze is +22%; Cyclodial spreads 15–40%
      fieldGain: [0.15, 0.4],
      vertical: difficulty === 'standard' ? [5, 12] : [2, 5],
      horizontal: SMALL_EXO,
      ...(difficulty === 'standard' ? FINE : COARSE),
    },
  }))

const verticalPalsy = (
  family: 'io-palsy' | 'sr-palsy' | 'ir-palsy',
  name: string,
  torsion: Record<Difficulty, NumberRange>,
  sources: string[],
) => (difficulty: Difficulty) =>
  sided(family, (side, word) => ({
    family,
    condition: family,
    side,
    difficulty,
    label: `${word[0]!.toUpperCase()}${word.slice(1)} ${name} palsy (${difficulty})`,
    sources: [S.domain, S.parks1958, S.flodin2020, ...sources],
    ranges: {
      torsion: torsion[difficulty],
      torsionOf: 'affected-eye',
      fieldGain: [0.1, 0.3],
      vertical: difficulty === 'standard' ? [5, 12] : [2, 5],
      horizontal: SMALL_EXO,
      ...(difficulty === 'standard' ? FINE : COARSE),
    },
  }))

// IO palsy: incyclo of the hypotropic eye (Donahue 2001); size not published there —
// Cyclodial keeps it below SO-palsy values (model choice).
const ioPalsy = verticalPalsy('io-palsy', 'inferior oblique', { standard: [2, 6], challenging: [1.5, 4] }, [S.donahue2001, S.modelChoice])
// SR/IR palsy: small torsion from the lost secondary action (derived from muscle actions).
const srPalsy = verticalPalsy('sr-palsy', 'superior rectus', { standard: [1, 3], challenging: [1, 2.5] }, [S.muscleActions])
const irPalsy = verticalPalsy('ir-palsy', 'inferior rectus', { standard: [1, 3], challenging: [1, 2.5] }, [S.muscleActions])

const bilateral = (difficulty: Difficulty): CaseTemplate =>
  t('bilateral-so-palsy', {
    family: 'bilateral-so-palsy',
    condition: 'bilateral-so-palsy',
    side: null,
    difficulty,
    label: `Bilateral superior oblique palsy (${difficulty})`,
    sources: [S.domain, S.jcm2020, S.jpos1993, S.signs1986],
    ranges: {
      // total 16.0 ± 5.5° (J Clin Med 2020): standard spans mean ± 1 SD; challenging sits low,
      // close to unilateral values, and is split unevenly between the eyes
      torsion: difficulty === 'standard' ? [10.5, 21.5] : [10, 13],
      torsionOf: 'total',
      fieldGain: [0.2, 0.45],
      vertical: [3, 8],
      horizontal: { near: [-2, 6], distance: [-2, 6] },
      ...(difficulty === 'standard' ? FINE : COARSE),
    },
  })

const ted = (difficulty: Difficulty): CaseTemplate =>
  t('ted-ir-restriction', {
    family: 'ted-ir-restriction',
    condition: 'ted-ir-restriction',
    side: null,
    sideFromSeed: true,
    difficulty,
    label: `Thyroid eye disease, inferior rectus restriction — ${difficulty === 'standard' ? 'one eye' : 'both eyes'} (${difficulty})`,
    sources: [S.domain, S.arnoldi2015],
    ranges: {
      // 5.5 ± 3° unilateral, 21 ± 5° bilateral (Arnoldi & Reynolds 2015)
      torsion: difficulty === 'standard' ? [2.5, 8.5] : [16, 26],
      torsionOf: difficulty === 'standard' ? 'affected-eye' : 'total',
      fieldGain: [0.1, 0.3],
      vertical: difficulty === 'standard' ? [4, 12] : [0, 3],
      horizontal: SMALL_EXO,
      ...(difficulty === 'standard' ? FINE : COARSE),
    },
  })

const skew = (difficulty: Difficulty): CaseTemplate =>
  t('skew-deviation', {
    family: 'skew-deviation',
    condition: 'skew-deviation',
    side: null,
    sideFromSeed: true,
    difficulty,
    label: `Skew deviation — ${difficulty === 'standard' ? 'with ocular tilt reaction torsion' : 'little torsion on DMR'} (${difficulty})`,
    sources:
      difficulty === 'standard'
        ? [S.domain, S.donahue2001, S.skew2005, S.wong2010]
        : [S.domain, S.arch1984, S.wong2010, S.flodin2020],
    ranges: {
      // standard: hypertropic eye incyclo, hypotropic eye excyclo, each 2–5° (model size);
      // challenging: sources disagree and some skews show no DMR torsion
      torsion: difficulty === 'standard' ? [2, 5] : [0, 0],
      torsionOf: 'hyper-and-hypo-eye',
      fieldGain: [0, 0.1],
      vertical: difficulty === 'standard' ? [4, 10] : [2, 6],
      horizontal: SMALL_EXO,
      ...(difficulty === 'standard' ? FINE : COARSE),
    },
  })

const longStanding = (difficulty: Difficulty): CaseTemplate =>
  t('long-standing-so-palsy', {
    family: 'long-standing-so-palsy',
    condition: 'long-standing-so-palsy',
    side: null,
    sideFromSeed: true,
    difficulty,
    label: `Long-standing superior oblique palsy that under-reports (${difficulty})`,
    sources: [S.domain, S.adaptation1979, S.kang2020, S.parks1958, ...(difficulty === 'challenging' ? [S.fixation1982] : [])],
    ranges: {
      // objective excyclo of the paretic eye: disc–fovea angle 12.19° vs 6.71° (≈5.5° more)
      torsion: [4, 9],
      torsionOf: 'objective-affected-eye',
      fieldGain: [0.15, 0.4],
      // large vertical deviations are common in long-standing palsies (model choice)
      vertical: difficulty === 'standard' ? [8, 16] : [12, 20],
      horizontal: SMALL_EXO,
      reportedShare: difficulty === 'standard' ? [0, 0.25] : [0, 0.15],
      ...(difficulty === 'challenging' ? { fellowReported: [2, 5] as NumberRange } : {}),
      ...FINE,
    },
  })

const suppression = (difficulty: Difficulty): CaseTemplate =>
  t('suppression', {
    family: 'suppression',
    condition: 'suppression',
    side: null,
    sideFromSeed: true,
    difficulty,
    label: `Suppression — ${difficulty === 'standard' ? 'one streak only' : 'second streak comes and goes'} (${difficulty})`,
    sources: [S.domain, S.maddoxRod, S.flodin2020],
    ranges: {
      torsion: [0, 2],
      torsionOf: 'each-eye',
      fieldGain: [0, 0],
      vertical: [0, 2],
      horizontal: difficulty === 'standard' ? { near: [15, 35], distance: [15, 35] } : { near: [8, 20], distance: [8, 20] },
      ...FINE,
    },
  })

const normal = (difficulty: Difficulty): CaseTemplate =>
  t('normal', {
    family: 'normal',
    condition: 'normal',
    side: null,
    difficulty,
    label: `No cyclovertical problem (${difficulty})`,
    sources: [S.domain, S.flodin2020],
    ranges: {
      // both eyes within about ±2°, about 1° excyclo on average (Flodin 2020)
      torsion: [-0.5, 2],
      torsionOf: 'each-eye',
      fieldGain: [0, 0],
      vertical: difficulty === 'standard' ? [0, 0] : [0, 1],
      horizontal: SMALL_EXO,
      ...(difficulty === 'standard' ? FINE : COARSE),
    },
  })

const BOTH: Difficulty[] = ['standard', 'challenging']

export const CASE_TEMPLATES: readonly CaseTemplate[] = [
  ...BOTH.map(normal),
  ...BOTH.flatMap(soPalsy),
  ...BOTH.map(bilateral),
  ...BOTH.flatMap(ioPalsy),
  ...BOTH.flatMap(srPalsy),
  ...BOTH.flatMap(irPalsy),
  ...BOTH.map(ted),
  ...BOTH.map(skew),
  ...BOTH.map(longStanding),
  ...BOTH.map(suppression),
]

const BY_ID = new Map(CASE_TEMPLATES.map(x => [x.id, x]))

/** Look a template up by id; a base id without difficulty (e.g. `so-palsy-right`) gives the standard one. */
export function getCaseTemplate(id: string): CaseTemplate | undefined {
  return BY_ID.get(id) ?? BY_ID.get(`${id}-standard`)
}

export const caseTemplateIds = (): string[] => CASE_TEMPLATES.map(x => x.id)
