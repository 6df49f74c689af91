// Which practice sets a member of staff may see: lecturers all; tutors those
// they sent, or sent to a cohort they teach.
import type { Kysely, SelectQueryBuilder } from 'kysely'
import type { Database } from '~~/db/schema'
import type { SessionUserData } from '#shared/auth/roles'

export function visibleSets<O>(db: Kysely<Database>, qb: SelectQueryBuilder<Database, 'practice_sets', O>, user: SessionUserData) {
  if (user.role === 'lecturer') return qb
  return qb.where(eb => eb.or([
    eb('practice_sets.created_by', '=', user.id),
    eb('practice_sets.cohort_id', 'in', db.selectFrom('cohort_members').select('cohort_id').where('user_id', '=', user.id)),
  ]))
}
