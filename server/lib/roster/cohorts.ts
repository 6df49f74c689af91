/** 409 naming the field when another cohort already has this name (case-insensitive). */
export async function assertCohortNameFree(name: string, exceptId?: number): Promise<void> {
  const db = await useDb()
  let q = db.selectFrom('cohorts').select('id').where(eb => eb(eb.fn('lower', ['name']), '=', name.toLowerCase()))
  if (exceptId) q = q.where('id', '!=', exceptId)
  if (await q.executeTakeFirst()) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `A cohort called “${name}” already exists.`, data: { code: 'cohort-exists', fields: [{ path: 'name', message: 'Already in use.' }] } })
  }
}

/** Cohort ids a person belongs to (a student's one cohort, or the cohorts a tutor teaches). */
export async function cohortIdsOf(userId: number): Promise<number[]> {
  const db = await useDb()
  const rows = await db.selectFrom('cohort_members').select('cohort_id').where('user_id', '=', userId).execute()
  return rows.map(r => r.cohort_id)
}
