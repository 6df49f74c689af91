// GET /api/review/practice-sets (tutor: theirs and their cohorts'; lecturer): the
// practice sets sent.
import { REVIEW_ROLES } from '#shared/auth/roles'
import { PATTERN_INFO, isPatternCode } from '#shared/review/patterns'
import { visibleSets } from '~~/server/lib/review/set-access'
import type { PracticeSetRow } from '#shared/types/review'

/** Practice sets sent from the review (tutors: theirs and their cohorts'), newest first. */
export default defineEventHandler(async (event): Promise<{ items: PracticeSetRow[] }> => {
  const user = await requireRole(event, ...REVIEW_ROLES)
  const db = await useDb()
  const rows = await visibleSets(db, db.selectFrom('practice_sets')
    .leftJoin('users', 'users.id', 'practice_sets.created_by')
    .leftJoin('cohorts', 'cohorts.id', 'practice_sets.cohort_id')
    .select(eb => [
      'practice_sets.id', 'practice_sets.title', 'practice_sets.focus', 'practice_sets.eye', 'practice_sets.scope', 'practice_sets.size', 'practice_sets.created_at',
      'users.name as sender', 'cohorts.name as cohort',
      eb.selectFrom('practice_set_learners').select(e => e.fn.countAll<number>().as('n')).whereRef('practice_set_learners.set_id', '=', 'practice_sets.id').as('learners'),
    ]), user)
    .orderBy('practice_sets.created_at', 'desc').orderBy('practice_sets.id', 'desc').limit(200).execute()
  return {
    items: rows.map(r => ({
      id: r.id,
      title: r.title,
      focus: r.focus,
      focusTitle: isPatternCode(r.focus) ? PATTERN_INFO[r.focus].title : r.focus,
      eye: r.eye,
      scope: r.scope,
      size: r.size,
      createdAt: r.created_at,
      sender: r.sender,
      cohort: r.cohort,
      learners: Number(r.learners ?? 0),
    })),
  }
})
