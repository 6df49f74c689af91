// Case rows: create one from a template + seed (or a tutor's spec), load one a
// person owns, regenerate the patient it stands for, and the view a learner may
// see. Plain functions taking `db` first, so quizzes and the demo seed use them too.
// Nothing here sends the truth: `practiceCaseView` goes through toPresentation only.
import { randomBytes } from 'node:crypto'
import type { Kysely } from 'kysely'
import type { Difficulty, Lights, Mode, Prism } from '#shared/engine/types'
import type { PatientTurnsResult } from '#shared/engine/presentation'
import type { PracticeCase } from '#shared/types/practice'
import type { CasePurpose, CaseRow, Database } from '~~/db/schema'
import { caseFromSpec, generateCase } from '~~/server/lib/engine/generator'
import { patientSetsRods } from '~~/server/lib/engine/patient'
import { toPresentation } from '~~/server/lib/engine/presentation'
import { getCaseTemplate } from '~~/server/lib/engine/templates'
import type { Case } from '~~/server/lib/engine/types'
import { baseTemplateId, baseTemplateTitle } from './templates'
import { nowIso } from '~~/server/utils/clock'

/** A request the case cannot serve; routes turn it into a 400 (or `status`) naming `field`. */
export class CaseInputError extends Error {
  constructor(readonly field: string, message: string, readonly status = 400, readonly code = 'invalid-input') {
    super(message)
  }
}

/** Random seeds are 12 hex digits: enough variety, short enough to read out. */
export const newCaseSeed = (): string => randomBytes(6).toString('hex')

/** Most turns one case keeps; a bound on what one learner can make the server store. */
export const MAX_TURNS_PER_CASE = 200

interface CaseRowCommon {
  ownerId: number | null
  purpose: CasePurpose
  mode: Mode
  readScale?: boolean
  quizId?: number | null
  quizItemId?: number | null
  practiceSetId?: number | null
  now?: string
}

export type NewCase
  = | (CaseRowCommon & { templateId: string, seed: string, templateHidden?: boolean })
    | (CaseRowCommon & { spec: unknown, specId?: number | null })

/** Insert a case row from a template (full id) + seed, or from a hand-authored spec (stored as a snapshot). */
export async function insertCase(db: Kysely<Database>, input: NewCase): Promise<{ row: CaseRow, patient: Case }> {
  const now = input.now ?? nowIso()
  let patient: Case
  let fromTemplate: { template_id: string, template_hidden: 0 | 1, spec_id: null, spec_json: null }
    | { template_id: null, template_hidden: 0, spec_id: number | null, spec_json: string }
  if ('templateId' in input) {
    const t = getCaseTemplate(input.templateId)
    if (!t || t.id !== input.templateId) throw new CaseInputError('template', `There is no case template called “${input.templateId}”.`)
    patient = generateCase(t, input.seed)
    fromTemplate = { template_id: t.id, template_hidden: input.templateHidden ? 1 : 0, spec_id: null, spec_json: null }
  }
  else {
    const built = caseFromSpec(input.spec)
    if (!built.ok) throw new CaseInputError(`spec.${built.issues[0]?.path ?? ''}`.replace(/\.$/, ''), built.issues.map(i => `${i.path}: ${i.message}`).join(' '))
    patient = built.case
    fromTemplate = { template_id: null, template_hidden: 0, spec_id: input.specId ?? null, spec_json: JSON.stringify(input.spec) }
  }
  const row = await db.insertInto('cases').values({
    owner_id: input.ownerId,
    purpose: input.purpose,
    ...fromTemplate,
    seed: patient.seed,
    generator_version: patient.generatorVersion,
    condition: patient.condition,
    difficulty: patient.difficulty ?? 'hand-authored',
    mode: input.mode,
    read_scale: input.readScale ? 1 : 0,
    quiz_id: input.quizId ?? null,
    quiz_item_id: input.quizItemId ?? null,
    practice_set_id: input.practiceSetId ?? null,
    created_at: now,
    updated_at: now,
  }).returningAll().executeTakeFirstOrThrow()
  return { row, patient }
}

/** The patient a case row stands for, rebuilt from its template or spec snapshot, seed and generator version. */
export function regenerateCase(row: Pick<CaseRow, 'template_id' | 'spec_json' | 'seed' | 'generator_version'>): Case {
  if (row.template_id) return generateCase(row.template_id, row.seed, row.generator_version)
  if (row.spec_json) {
    const built = caseFromSpec(JSON.parse(row.spec_json))
    if (!built.ok) throw new Error(`stored case spec no longer valid: ${built.issues.map(i => i.path).join(', ')}`)
    return built.case
  }
  throw new Error('case row has neither a template nor a spec')
}

/** A case of this purpose owned by this person, or undefined (the route answers 404). */
export function findOwnedCase(db: Kysely<Database>, id: number, ownerId: number, purpose: CasePurpose = 'practice'): Promise<CaseRow | undefined> {
  return db.selectFrom('cases').selectAll()
    .where('id', '=', id).where('owner_id', '=', ownerId).where('purpose', '=', purpose)
    .executeTakeFirst()
}

/** Template title of a case row, e.g. "Acquired right superior oblique palsy (standard)"; a spec's own label. */
export function caseTitle(row: CaseRow, patient?: Case): string {
  if (row.template_id) return getCaseTemplate(row.template_id)?.label ?? row.template_id
  return (patient ?? regenerateCase(row)).label
}

/**
 * What a learner may see of a case. While the template is hidden (the server chose
 * it) and `revealed` is false, neither the template nor its title is named.
 */
export function practiceCaseView(row: CaseRow, patient: Case, revealed: boolean): PracticeCase {
  const named = revealed || !row.template_hidden
  const t = row.template_id ? getCaseTemplate(row.template_id) : undefined
  return {
    id: row.id,
    // a hidden case's seed would name the template when replayed with each named one
    seed: named ? row.seed : null,
    template: named && row.template_id ? baseTemplateId(row.template_id) : null,
    title: named ? (t ? baseTemplateTitle(t) : patient.label) : null,
    difficulty: (row.difficulty === 'challenging' ? 'challenging' : 'standard') as Difficulty,
    mode: row.mode,
    readScale: row.read_scale === 1,
    presentation: toPresentation(patient, row.mode),
  }
}

export interface TurnSetting {
  gaze: PatientTurnsResult['gaze']
  distance: PatientTurnsResult['distance']
  prisms?: Prism[]
  lights?: Lights
}

/**
 * Patient-turns: the patient turns both rods for this setting. The trial number
 * comes from the case's counter (so the same trial always replays the same
 * setting) and the turn is stored with its result.
 */
export async function recordTurn(db: Kysely<Database>, row: CaseRow, setting: TurnSetting, now = nowIso()): Promise<PatientTurnsResult> {
  if (row.mode !== 'patient-turns') {
    throw new CaseInputError('mode', 'In learner-turns mode you turn the rods yourself; the patient does not.', 409, 'wrong-mode')
  }
  const patient = regenerateCase(row)
  const run = async (trx: Kysely<Database>) => {
    const bumped = await trx.updateTable('cases')
      .set(eb => ({ trial_count: eb('trial_count', '+', 1), updated_at: now }))
      .where('id', '=', row.id).where('trial_count', '<', MAX_TURNS_PER_CASE)
      .returning('trial_count').executeTakeFirst()
    if (!bumped) throw new CaseInputError('trial', `This case has had its ${MAX_TURNS_PER_CASE} turns; start another case.`, 409, 'too-many-turns')
    const prisms = setting.prisms ?? []
    const lights = setting.lights ?? 'dim'
    const result = patientSetsRods(patient, { gaze: setting.gaze, distance: setting.distance, prisms, lights, trial: bumped.trial_count })
    await trx.insertInto('case_turns').values({
      case_id: row.id,
      trial: bumped.trial_count,
      gaze: setting.gaze,
      distance: setting.distance,
      prisms_json: JSON.stringify(prisms),
      lights,
      result_json: JSON.stringify(result),
      created_at: now,
    }).execute()
    return result
  }
  return db.isTransaction ? run(db) : db.transaction().execute(run)
}

export interface StoredTurn extends TurnSetting {
  trial: number
  prisms: Prism[]
  lights: Lights
  result: PatientTurnsResult
}

export async function caseTurns(db: Kysely<Database>, caseId: number): Promise<StoredTurn[]> {
  const rows = await db.selectFrom('case_turns').selectAll().where('case_id', '=', caseId).orderBy('trial').execute()
  return rows.map(r => ({
    trial: r.trial,
    gaze: r.gaze as StoredTurn['gaze'],
    distance: r.distance as StoredTurn['distance'],
    prisms: JSON.parse(r.prisms_json) as Prism[],
    lights: r.lights as Lights,
    result: JSON.parse(r.result_json) as PatientTurnsResult,
  }))
}
