// Loading a stored case for its fundus: only the owner's own practice cases, rebuilt
// exactly as stored (regenerateCase: template + seed + generator version, or the
// hand-authored snapshot), never from a newer generator.

import type { SessionUserData } from '#shared/auth/roles'
import type { CaseRow } from '~~/db/schema'
import type { Case } from '~~/server/lib/engine/types'
import { regenerateCase } from '~~/server/lib/practice/cases'
import { cohortIdsOf } from '~~/server/lib/roster/cohorts'

/** Purposes whose truth a learner may see straight after measuring (not quiz cases). */
const OPEN_PURPOSES = ['practice', 'preview'] as const

/** The caller's own practice case, or a 404 for anyone else's (or a quiz case). */
export async function ownCaseForFundus(user: SessionUserData, id: number): Promise<{ row: CaseRow, case: Case }> {
  const db = await useDb()
  const row = await db.selectFrom('cases').selectAll()
    .where('id', '=', id)
    .where('owner_id', '=', user.id)
    .where('purpose', 'in', [...OPEN_PURPOSES])
    .executeTakeFirst()
  if (!row) notFound('That case')
  return { row, case: regenerateCase(row) }
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
