// Quiz items. An item's config is a snapshot taken when the tutor adds it (the
// casebook template's ranges or the exact case's numbers), so later casebook edits
// never change a quiz that is running. `kind` says how the config reads: 'dmr'
// (a case on the bench) or 'fundus' (a case's fundus, or a tutor's photograph).
import type { Kysely } from 'kysely'
import { createError } from 'h3'
import type { CaseSpec } from '#shared/engine/case-spec'
import type { Mode, Eye } from '#shared/engine/types'
import type { CaseSource, NarrowedRanges } from '#shared/schemas/casebook'
import type { DmrItemBody, FundusItemBody, QuizCriterion, QuizItemKind, Weights } from '#shared/schemas/quiz'
import { CRITERION_LABELS, QUIZ_CRITERIA, criteriaOfKind } from '#shared/schemas/quiz'
import type { Point } from '#shared/engine/fundus/geometry'
import type { SessionUserData } from '#shared/auth/roles'
import type { Database, QuizItemRow } from '~~/db/schema'
import { caseFromSpec, generateCase } from '~~/server/lib/engine/generator'
import { DEFAULT_GRADE_TOLERANCE, DEFAULT_GRADE_WEIGHTS } from '~~/server/lib/engine/grader'
import { getCaseTemplate } from '~~/server/lib/engine/templates'
import type { Case } from '~~/server/lib/engine/types'
import type { StaffItemSource, StaffQuizItem } from '#shared/types/quiz'
import { photoVisibleTo } from '~~/server/lib/fundus/photo-access'
import { narrowedCase } from './narrow'
import { quizCaseSeed } from './seeds'

/** The interpretation step's weight unless the tutor sets one. */
export const DEFAULT_INTERPRETATION_WEIGHT = 2

/** A fundus item's two criteria: the angle the marks make, and the finding recorded (per eye, averaged). */
export const DEFAULT_FUNDUS_WEIGHTS = { fundusAngle: 2, fundusFinding: 2 } as const

export const DEFAULT_QUIZ_WEIGHTS: Record<QuizCriterion, number> = {
  ...DEFAULT_GRADE_WEIGHTS,
  interpretation: DEFAULT_INTERPRETATION_WEIGHT,
  ...DEFAULT_FUNDUS_WEIGHTS,
}

/** The angle tolerance of a fundus item unless the tutor sets one (the practice grading's 1°). */
export const DEFAULT_FUNDUS_ITEM_TOLERANCE = 1

export type DmrSourceSnapshot
  = | { type: 'engine', templateId: string, title: string }
    | { type: 'template', id: number, templateId: string, ranges: NarrowedRanges, title: string }
    | { type: 'case', id: number, spec: CaseSpec, title: string }

export interface DmrItemConfig {
  kind: 'dmr'
  source: DmrSourceSnapshot
  /** Each student their own case (templates only; an exact case is one for all). */
  perStudent: boolean
  mode: Mode
  readScale: boolean
  tolerance: number
  /** Every criterion's weight, resolved when the item was saved (0 = does not count). */
  weights: Record<QuizCriterion, number>
}

/**
 * A tutor's photograph as the item saw it when it was added: its size, eye and
 * reference marks are copied, so re-marking the photograph later never changes
 * a running quiz (the pixels are served from the photograph itself).
 */
export interface PhotoSourceSnapshot {
  type: 'photo'
  id: number
  title: string
  eye: Eye
  width: number
  height: number
  disc: Point
  fovea: Point
  /** The reference disc–fovea angle, degrees (staff only; the truth of the item). */
  angle: number
}

export type FundusSourceSnapshot = DmrSourceSnapshot | PhotoSourceSnapshot

export interface FundusItemConfig {
  kind: 'fundus'
  source: FundusSourceSnapshot
  /** Generated sources: each student their own case (an exact case or a photograph is one for all). */
  perStudent: boolean
  /** Angle tolerance, degrees: full mark within it, half within twice it. */
  tolerance: number
  weights: Record<QuizCriterion, number>
}

export type QuizItemConfig = DmrItemConfig | FundusItemConfig

export function readItemConfig(row: Pick<QuizItemRow, 'kind' | 'config_json'>): QuizItemConfig {
  const config = JSON.parse(row.config_json) as QuizItemConfig
  if (!['dmr', 'fundus'].includes(row.kind) || config.kind !== row.kind) throw new Error(`Quiz item kind "${row.kind}" is not known to this build.`)
  return config
}

/** The eyes a fundus item asks the student to measure: both on a case, the photographed one on a photograph. */
export const fundusItemEyes = (config: FundusItemConfig): Eye[] => (config.source.type === 'photo' ? [config.source.eye] : ['RE', 'LE'])

export function resolveWeights(given: Weights | undefined, base: Record<QuizCriterion, number> = DEFAULT_QUIZ_WEIGHTS, kind: QuizItemKind = 'dmr'): Record<QuizCriterion, number> {
  const out = {} as Record<QuizCriterion, number>
  for (const c of criteriaOfKind(kind)) out[c] = given?.[c] ?? base[c] ?? DEFAULT_QUIZ_WEIGHTS[c]
  return out
}

/** 400 naming each weight given for a criterion the item kind does not mark. */
export function assertWeightsOfKind(given: Weights | undefined, kind: QuizItemKind): void {
  const own = criteriaOfKind(kind)
  const stray = QUIZ_CRITERIA.filter(c => given?.[c] !== undefined && !own.includes(c))
  if (!stray.length) return
  const what = kind === 'fundus' ? 'a fundus item' : 'a double Maddox rod item'
  const fields = stray.map(c => ({ path: `weights.${c}`, message: `${CRITERION_LABELS[c]} is not marked on ${what}; it marks ${own.map(k => CRITERION_LABELS[k].toLowerCase()).join(', ')}.` }))
  throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: fields.map(f => `${f.path}: ${f.message}`).join(' '), data: { code: 'invalid-input', fields } })
}

function sourceProblem(message: string, path = 'source'): never {
  throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: `${path}: ${message}`, data: { code: 'invalid-input', fields: [{ path, message }] } })
}

/** Casebook rows the user may use: their own; lecturers and admins anyone's. */
const seesAllCasebooks = (user: SessionUserData) => user.role === 'lecturer' || user.role === 'admin'

/** Resolve a source named in a body into a snapshot, with the default tolerance it brings. */
export async function snapshotSource(db: Kysely<Database>, user: SessionUserData, source: CaseSource): Promise<{ snapshot: DmrSourceSnapshot, tolerance: number }> {
  if (source.type === 'engine') {
    const t = getCaseTemplate(source.templateId)
    if (!t || t.id !== source.templateId) sourceProblem(`There is no case template "${source.templateId}".`)
    return { snapshot: { type: 'engine', templateId: t.id, title: t.label }, tolerance: DEFAULT_GRADE_TOLERANCE }
  }
  if (source.type === 'template') {
    let q = db.selectFrom('casebook_templates').selectAll().where('id', '=', source.id).where('archived_at', 'is', null)
    if (!seesAllCasebooks(user)) q = q.where('owner_id', '=', user.id)
    const row = await q.executeTakeFirst()
    if (!row) sourceProblem('That case template is not in your casebook.')
    return {
      snapshot: { type: 'template', id: row.id, templateId: row.template_id, ranges: JSON.parse(row.ranges_json) as NarrowedRanges, title: row.title },
      tolerance: row.tolerance,
    }
  }
  let q = db.selectFrom('casebook_cases').selectAll().where('id', '=', source.id).where('archived_at', 'is', null)
  if (!seesAllCasebooks(user)) q = q.where('owner_id', '=', user.id)
  const row = await q.executeTakeFirst()
  if (!row) sourceProblem('That case is not in your casebook.')
  return { snapshot: { type: 'case', id: row.id, spec: JSON.parse(row.spec_json) as CaseSpec, title: row.title }, tolerance: row.tolerance }
}

/**
 * A photograph the tutor may see (the fundus library's rule), with reference marks.
 * One the tutor may not see is refused as if it did not exist.
 */
export async function snapshotPhoto(db: Kysely<Database>, user: SessionUserData, id: number): Promise<PhotoSourceSnapshot> {
  const photo = await photoVisibleTo(db, user, id)
  if (!photo) sourceProblem('That fundus photograph is not in your fundus library.', 'source.id')
  if (photo.reference_angle === null || photo.disc_x === null || photo.disc_y === null || photo.fovea_x === null || photo.fovea_y === null) {
    sourceProblem(`“${photo.title}” has no reference marks yet: mark its disc centre and fovea on the photograph's page first.`, 'source.id')
  }
  return {
    type: 'photo',
    id: photo.id,
    title: photo.title,
    eye: photo.eye,
    width: photo.width,
    height: photo.height,
    disc: { x: photo.disc_x, y: photo.disc_y },
    fovea: { x: photo.fovea_x, y: photo.fovea_y },
    angle: photo.reference_angle,
  }
}

/** A fundus item's source as a snapshot. */
export async function snapshotFundusSource(db: Kysely<Database>, user: SessionUserData, source: FundusItemBody['source']): Promise<FundusSourceSnapshot> {
  if (source.type === 'photo') return snapshotPhoto(db, user, source.id)
  return (await snapshotSource(db, user, source)).snapshot
}

/** One for all: an exact case and a photograph are the same for every student. */
export const fixedSource = (src: FundusSourceSnapshot): boolean => src.type === 'case' || src.type === 'photo'

/** Build the stored config of a new item from its body. */
export async function itemConfigFromBody(db: Kysely<Database>, user: SessionUserData, body: DmrItemBody | FundusItemBody): Promise<QuizItemConfig> {
  assertWeightsOfKind(body.weights, body.kind)
  if (body.kind === 'fundus') {
    const source = await snapshotFundusSource(db, user, body.source)
    return {
      kind: 'fundus',
      source,
      perStudent: fixedSource(source) ? false : body.perStudent ?? true,
      tolerance: body.tolerance ?? DEFAULT_FUNDUS_ITEM_TOLERANCE,
      weights: resolveWeights(body.weights, DEFAULT_QUIZ_WEIGHTS, 'fundus'),
    }
  }
  const { snapshot, tolerance } = await snapshotSource(db, user, body.source)
  return {
    kind: 'dmr',
    source: snapshot,
    perStudent: snapshot.type === 'case' ? false : body.perStudent ?? true,
    mode: body.mode ?? 'patient-turns',
    readScale: body.readScale ?? false,
    tolerance: body.tolerance ?? tolerance,
    weights: resolveWeights(body.weights),
  }
}

export interface BuiltCase {
  case: Case
  seed: string
  templateId: string | null
  specId: number | null
  specJson: string | null
}

/** The case a source makes for a seed (an exact case ignores the seed). */
export function caseFromSnapshot(src: DmrSourceSnapshot, seed: string): BuiltCase {
  if (src.type === 'case') {
    const built = caseFromSpec(src.spec)
    if (!built.ok) throw new Error(`Stored exact case ${src.id} no longer validates: ${built.issues.map(i => i.message).join(' ')}`)
    return { case: built.case, seed: built.case.seed, templateId: null, specId: src.id, specJson: JSON.stringify(src.spec) }
  }
  if (src.type === 'template' && (src.ranges.torsion || src.ranges.vertical)) {
    const found = narrowedCase(src.templateId, src.ranges, seed)
    return { case: found.case, seed: found.seed, templateId: src.templateId, specId: null, specJson: null }
  }
  return { case: generateCase(src.templateId, seed), seed, templateId: src.templateId, specId: null, specJson: null }
}

/**
 * The case an item gives a student (or everyone): derived from the quiz seed, the
 * item id and — for per-student items — the student id. Pure: the same inputs give
 * the same patient, which is how a tutor opens exactly what a student saw.
 */
export function buildItemCase(config: QuizItemConfig, quizSeed: string, itemId: number, studentId: number | null): BuiltCase {
  if (config.source.type === 'photo') throw new Error('A photograph item has no case.')
  return caseFromSnapshot(config.source, quizCaseSeed(quizSeed, itemId, config.perStudent ? studentId : null))
}

/** Whether an item gives each student a stored case (every item but a photograph one). */
export const itemHasCase = (config: QuizItemConfig): boolean => config.source.type !== 'photo'

/** What a tutor sees about an item (never sent to students). */
export function itemSummaryForStaff(row: QuizItemRow): StaffQuizItem {
  const config = readItemConfig(row)
  const src = config.source
  const source: StaffItemSource = src.type === 'case'
    ? { type: 'case', id: src.id, title: src.title }
    : src.type === 'template'
      ? { type: 'template', id: src.id, templateId: src.templateId, ranges: src.ranges, title: src.title }
      : src.type === 'photo'
        ? { type: 'photo', id: src.id, title: src.title, eye: src.eye, angle: src.angle }
        : { type: 'engine', templateId: src.templateId, title: src.title }
  return {
    id: row.id,
    position: row.position,
    kind: config.kind,
    prompt: row.prompt,
    source,
    perStudent: config.perStudent,
    mode: config.kind === 'dmr' ? config.mode : null,
    readScale: config.kind === 'dmr' ? config.readScale : false,
    tolerance: config.tolerance,
    weights: config.weights,
  }
}
