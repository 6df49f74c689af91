// The opening of every review route: role first, then the filters, then the
// caller's cohort scope (a cohort outside it is a 404).
import { REVIEW_ROLES } from '#shared/auth/roles'
import type { H3Event } from 'h3'
import type { z } from 'zod'
import type { ReviewFilters } from '#shared/schemas/review'
import { reviewScopeFor } from './scope'

export async function reviewRequest<S extends z.ZodType<ReviewFilters & Record<string, unknown>>>(event: H3Event, schema: S) {
  const user = await requireRole(event, ...REVIEW_ROLES)
  const query = queryAs(event, schema) as z.output<S>
  const db = await useDb()
  const scope = await reviewScopeFor(db, user, query.cohortId)
  return { user, query, db, scope }
}
