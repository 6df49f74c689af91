// GET /api/review/options (tutor, lecturer): what the filters offer the caller: `{
// cohorts, templates, conditions, quizzes, role }`
import { REVIEW_ROLES } from '#shared/auth/roles'
import type { ReviewOptions } from '#shared/types/review'
import { CASE_TEMPLATES } from '~~/server/lib/engine/templates'
import { CONDITIONS } from '#shared/engine/case-spec'
import { visibleCohorts } from '~~/server/lib/review/scope'

/** What the review filters can offer this caller: their cohorts, case templates, conditions, quizzes attempted. */
export default defineEventHandler(async (event): Promise<ReviewOptions> => {
  const user = await requireRole(event, ...REVIEW_ROLES)
  const db = await useDb()
  const cohorts = await visibleCohorts(db, user)
  const templates = [...new Map(CASE_TEMPLATES.map((t) => {
    const base = t.id.replace(/-(standard|challenging)$/, '')
    return [base, { id: base, label: t.label.replace(/\s*\((standard|challenging)\)$/, '') }] as const
  })).values()]
  // quizzes set for the caller's cohorts (all for a lecturer)
  let quizQ = db.selectFrom('quizzes').select(['quizzes.id', 'quizzes.title']).where('quizzes.archived_at', 'is', null)
  if (user.role !== 'lecturer') {
    quizQ = quizQ.where('quizzes.id', 'in', eb => eb.selectFrom('quiz_cohorts').select('quiz_id').where('cohort_id', 'in', cohorts.length ? cohorts.map(c => c.id) : [-1]))
  }
  const quizzes = await quizQ.orderBy('quizzes.title').orderBy('quizzes.id').execute()
  return { cohorts, templates, conditions: CONDITIONS.filter(c => c !== 'hand-authored'), quizzes, role: user.role }
})
