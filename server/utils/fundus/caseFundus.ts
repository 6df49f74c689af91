// Loading a stored case for its fundus: only the owner's own practice cases, and the
// case rebuilt exactly as stored (template + seed + generator version, or the
// hand-authored snapshot), never from a newer generator.

import type { SessionUserData } from '#shared/auth/roles'
import type { CaseRow } from '~~/db/schema'
import { caseFromSpec, generateCase } from '../engine/generator'
import type { Case } from '../engine/types'

/** Purposes whose truth a learner may see straight after measuring (not quiz cases). */
const OPEN_PURPOSES = ['practice', 'preview'] as const

export function rebuildCaseForFundus(row: Pick<CaseRow, 'template_id' | 'spec_json' | 'seed' | 'generator_version'>): Case {
  if (row.spec_json) {
    const built = caseFromSpec(JSON.parse(row.spec_json))
    if (!built.ok) throw new Error('A stored hand-authored case no longer validates.')
    return built.case
  }
  if (!row.template_id) throw new Error('A stored case has neither a template nor a spec.')
  return generateCase(row.template_id, row.seed, row.generator_version)
}

/** The caller's own practice case, or a 404 for anyone else's (or a quiz case). */
export async function ownCaseForFundus(user: SessionUserData, id: number): Promise<{ row: CaseRow, case: Case }> {
  const db = await useDb()
  const row = await db.selectFrom('cases').selectAll()
    .where('id', '=', id)
    .where('owner_id', '=', user.id)
    .where('purpose', 'in', [...OPEN_PURPOSES])
    .executeTakeFirst()
  if (!row) notFound('That case')
  return { row, case: rebuildCaseForFundus(row) }
}

/** Whether the learner has recorded a double Maddox rod attempt on this case yet. */
export async function dmrRecordedOn(caseId: number): Promise<boolean> {
  const db = await useDb()
  return !!(await db.selectFrom('attempts').select('id').where('case_id', '=', caseId).limit(1).executeTakeFirst())
}

/** The cohort a learner's attempt is counted in (a student's one cohort), or null. */
export async function learnerCohortId(user: SessionUserData): Promise<number | null> {
  if (user.role !== 'student') return null
  return (await cohortIdsOf(user.id))[0] ?? null
}
