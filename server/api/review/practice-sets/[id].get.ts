// GET /api/review/practice-sets/:id (tutor, lecturer): one set with `before`/`after` (`{
// attempts, slipped, rate /* per 100 */ }`) overall and per learner, cases done and the
// conditions used.
import { idParam } from '#shared/schemas/common'
import { REVIEW_ROLES } from '#shared/auth/roles'
import { SLIP_INFO } from '#shared/engine/slips'
import type { Eye } from '#shared/engine/types'
import { PATTERN_INFO, isPatternCode } from '#shared/review/patterns'
import { setProgress } from '~~/server/lib/review/practice-sets'
import { visibleSets } from '~~/server/lib/review/set-access'
import type { PracticeSetDetail } from '#shared/types/review'

/** One practice set and whether the focus slip became rarer after it was sent. */
export default defineEventHandler(async (event): Promise<PracticeSetDetail> => {
  const user = await requireRole(event, ...REVIEW_ROLES)
  const { id } = paramsAs(event, idParam)
  const db = await useDb()
  const set = await visibleSets(db, db.selectFrom('practice_sets')
    .leftJoin('users', 'users.id', 'practice_sets.created_by')
    .leftJoin('cohorts', 'cohorts.id', 'practice_sets.cohort_id')
    .selectAll('practice_sets').select(['users.name as sender', 'cohorts.name as cohort'])
    .where('practice_sets.id', '=', id), user).executeTakeFirst()
  if (!set || !isPatternCode(set.focus)) notFound('That practice set')
  const progress = await setProgress(db, { id: set.id, focus: set.focus, eye: set.eye as Eye | null })
  const cases = await db.selectFrom('cases').select(['template_id', 'condition', 'mode']).where('practice_set_id', '=', set.id)
    .orderBy('id').execute()
  const conditions = Object.entries(cases.reduce<Record<string, number>>((acc, c) => ({ ...acc, [c.condition]: (acc[c.condition] ?? 0) + 1 }), {}))
    .map(([condition, n]) => ({ condition, cases: n }))
  return {
    id: set.id,
    title: set.title,
    focus: set.focus,
    focusTitle: PATTERN_INFO[set.focus].title,
    eye: set.eye,
    scope: set.scope,
    size: set.size,
    mode: set.mode,
    note: set.note,
    createdAt: set.created_at,
    sender: set.sender,
    cohort: set.cohort,
    slips: progress.slips.map(code => ({ code, title: SLIP_INFO[code].title })),
    conditions,
    before: progress.before,
    after: progress.after,
    learners: progress.learners,
  }
})
