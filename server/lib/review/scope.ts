// Who may see which cohorts on the slip-patterns review. Lecturers see every
// cohort; tutors only the cohorts they teach (cohort_members). A cohort outside
// the caller's scope is "not found", so a tutor cannot learn that it exists.
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'
import { statementsAtOnce } from '~~/db/dialect'
import type { SessionUserData } from '#shared/auth/roles'

export interface ReviewScope {
  /** null = every cohort (lecturer without a cohort filter). */
  cohortIds: number[] | null
  role: SessionUserData['role']
  userId: number
}

export async function reviewScopeFor(db: Kysely<Database>, user: SessionUserData, cohortId?: number): Promise<ReviewScope> {
  if (user.role === 'lecturer') {
    if (cohortId === undefined) return { cohortIds: null, role: user.role, userId: user.id }
    const exists = await db.selectFrom('cohorts').select('id').where('id', '=', cohortId).executeTakeFirst()
    if (!exists) notFound('That cohort')
    return { cohortIds: [cohortId], role: user.role, userId: user.id }
  }
  const rows = await db.selectFrom('cohort_members').select('cohort_id').where('user_id', '=', user.id).execute()
  const mine = rows.map(r => r.cohort_id).sort((a, b) => a - b)
  if (cohortId !== undefined) {
    if (!mine.includes(cohortId)) notFound('That cohort')
    return { cohortIds: [cohortId], role: user.role, userId: user.id }
  }
  return { cohortIds: mine, role: user.role, userId: user.id }
}

/** The cohorts the filter list offers: all for a lecturer, taught ones for a tutor. */
export async function visibleCohorts(db: Kysely<Database>, user: SessionUserData): Promise<{ id: number, name: string }[]> {
  let q = db.selectFrom('cohorts').select(['cohorts.id', 'cohorts.name']).orderBy('cohorts.name')
  if (user.role !== 'lecturer') {
    q = q.where('cohorts.id', 'in', eb => eb.selectFrom('cohort_members').select('cohort_id').where('user_id', '=', user.id))
  }
  return q.execute()
}

/** May this caller see a learner (a student in one of the scope's cohorts)? */
export async function learnerInScope(db: Kysely<Database>, scope: ReviewScope, learnerId: number): Promise<boolean> {
  let q = db.selectFrom('users').innerJoin('cohort_members', 'cohort_members.user_id', 'users.id')
    .select('users.id').where('users.id', '=', learnerId).where('users.role', '=', 'student')
  if (scope.cohortIds) q = q.where('cohort_members.cohort_id', 'in', scope.cohortIds.length ? scope.cohortIds : [-1])
  return !!(await q.executeTakeFirst())
}

/**
 * Runs a grouped query once per part of the scope's cohorts and joins the rows. Every
 * review aggregate groups by cohort first and adds its rows up in JavaScript, so the
 * parts' rows together are exactly the rows of the whole. On PostgreSQL the parts
 * (statementsAtOnce) run side by side; on SQLite the scope stays whole.
 */
export async function byCohortParts<R>(db: Kysely<Database>, scope: ReviewScope, run: (part: ReviewScope) => Promise<R[]>, parts = statementsAtOnce(db)): Promise<R[]> {
  if (parts < 2 || (scope.cohortIds && scope.cohortIds.length < 2)) return run(scope)
  const ids = scope.cohortIds ?? (await db.selectFrom('cohorts').select('id').orderBy('id').execute()).map(r => r.id)
  if (ids.length < 2) return run(scope)
  const groups: number[][] = Array.from({ length: Math.min(parts, ids.length) }, () => [])
  ids.forEach((id, i) => groups[i % groups.length]!.push(id))
  return (await Promise.all(groups.map(cohortIds => run({ ...scope, cohortIds })))).flat()
}
