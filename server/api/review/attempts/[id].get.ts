// GET /api/review/attempts/:id (tutor (own cohorts), lecturer): staff replay: `{
// attempt, result, case: { …, presentation }, turns, learner, cohort, kind, quizId }`;
// `404` outside the caller's cohorts
import { idParam } from '#shared/schemas/common'
import { REVIEW_ROLES } from '#shared/auth/roles'
import { staffReplay } from '~~/server/lib/review/replay'
import { reviewScopeFor } from '~~/server/lib/review/scope'
import type { StaffAttemptReplay } from '#shared/types/review'

/** One attempt's bench state and result, for the read-only replay (tutors: their cohorts only). */
export default defineEventHandler(async (event): Promise<StaffAttemptReplay> => {
  const user = await requireRole(event, ...REVIEW_ROLES)
  const { id } = paramsAs(event, idParam)
  const db = await useDb()
  const scope = await reviewScopeFor(db, user)
  // lecturers see every attempt, including any outside a cohort
  const replay = await staffReplay(db, id, user.role === 'lecturer' ? { ...scope, cohortIds: null } : scope)
  if (!replay) notFound('That attempt')
  return replay
})
