// Quiz items. An item's config is a snapshot taken when the tutor adds it (the
// casebook template's ranges or the exact case's numbers), so later casebook edits
// never change a quiz that is running. `kind` says how the config reads: 'dmr' now;
// another kind adds a member to QuizItemConfig and a branch in buildItemCase.
import type { Kysely } from 'kysely'
import { createError } from 'h3'
import type { CaseSpec } from '#shared/engine/caseSpec'
import type { Mode } from '#shared/engine/types'
import type { CaseSource, NarrowedRanges } from '#shared/schemas/casebook'
import type { QuizCriterion, QuizItemBody, Weights } from '#shared/schemas/quiz'
import { QUIZ_CRITERIA } from '#shared/schemas/quiz'
import type { SessionUserData } from '#shared/auth/roles'
import type { Database, QuizItemRow } from '~~/db/schema'
import { caseFromSpec, generateCase } from '../engine/generator'
import { DEFAULT_GRADE_TOLERANCE, DEFAULT_GRADE_WEIGHTS } from '../engine/grader'
import { getCaseTemplate } from '../engine/templates'
import type { Case } from '../engine/types'
import { narrowedCase } from './narrow'
import { quizCaseSeed } from './seeds'

/** The interpretation step's weight unless the tutor sets one. */
export const DEFAULT_INTERPRETATION_WEIGHT = 2

export const DEFAULT_QUIZ_WEIGHTS: Record<QuizCriterion, number> = {
  ...DEFAULT_GRADE_WEIGHTS,
  interpretation: DEFAULT_INTERPRETATION_WEIGHT,
}

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

export type QuizItemConfig = DmrItemConfig

export function readItemConfig(row: Pick<QuizItemRow, 'kind' | 'config_json'>): QuizItemConfig {
  const config = JSON.parse(row.config_json) as QuizItemConfig
  if (row.kind !== 'dmr' || config.kind !== 'dmr') throw new Error(`Quiz item kind "${row.kind}" is not known to this build.`)
  return config
}

export function resolveWeights(given: Weights | undefined, base: Record<QuizCriterion, number> = DEFAULT_QUIZ_WEIGHTS): Record<QuizCriterion, number> {
  const out = { ...base }
  for (const c of QUIZ_CRITERIA) if (given?.[c] !== undefined) out[c] = given[c]!
  return out
}

function sourceProblem(message: string): never {
  throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: `source: ${message}`, data: { code: 'invalid-input', fields: [{ path: 'source', message }] } })
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

/** Build the stored config of a new item from its body. */
export async function itemConfigFromBody(db: Kysely<Database>, user: SessionUserData, body: QuizItemBody & { kind: 'dmr' }): Promise<DmrItemConfig> {
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
  return caseFromSnapshot(config.source, quizCaseSeed(quizSeed, itemId, config.perStudent ? studentId : null))
}

/** What a tutor sees about an item (never sent to students). */
export function itemSummaryForStaff(row: QuizItemRow) {
  const config = readItemConfig(row)
  return {
    id: row.id,
    position: row.position,
    kind: row.kind,
    prompt: row.prompt,
    source: config.source.type === 'case'
      ? { type: 'case' as const, id: config.source.id, title: config.source.title }
      : config.source.type === 'template'
        ? { type: 'template' as const, id: config.source.id, templateId: config.source.templateId, ranges: config.source.ranges, title: config.source.title }
        : { type: 'engine' as const, templateId: config.source.templateId, title: config.source.title },
    perStudent: config.perStudent,
    mode: config.mode,
    readScale: config.readScale,
    tolerance: config.tolerance,
    weights: config.weights,
  }
}
