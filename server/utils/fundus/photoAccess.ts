// Who may see a fundus photograph: lecturers and admins always; the person who
// uploaded it; and anyone (student or tutor) in a cohort it is shared with — by
// default the cohorts its tutor teaches. Everyone else is told it does not exist.

import type { SessionUserData } from '#shared/auth/roles'
import type { FundusPhotoRow } from '~~/db/schema'

export const seesEveryFundusPhoto = (user: SessionUserData): boolean => user.role === 'lecturer' || user.role === 'admin'

/** May change or delete it: the uploader, a lecturer or an admin. */
export const managesFundusPhoto = (user: SessionUserData, photo: Pick<FundusPhotoRow, 'owner_id'>): boolean =>
  seesEveryFundusPhoto(user) || (user.role === 'tutor' && photo.owner_id === user.id)

/** The photograph if this person may see it, otherwise a 404 (never a hint that it exists). */
export async function fundusPhotoFor(user: SessionUserData, id: number): Promise<FundusPhotoRow> {
  const db = await useDb()
  const photo = await db.selectFrom('fundus_photos').selectAll().where('id', '=', id).executeTakeFirst()
  if (!photo) notFound('That fundus photograph')
  if (seesEveryFundusPhoto(user) || photo.owner_id === user.id) return photo
  const shared = await db.selectFrom('fundus_photo_cohorts as pc')
    .innerJoin('cohort_members as m', 'm.cohort_id', 'pc.cohort_id')
    .select('pc.photo_id')
    .where('pc.photo_id', '=', id)
    .where('m.user_id', '=', user.id)
    .executeTakeFirst()
  if (!shared) notFound('That fundus photograph')
  return photo
}

/** Cohort ids a person may share a photograph with: a tutor's own cohorts, or any for lecturers and admins. */
export async function shareableCohortIds(user: SessionUserData): Promise<number[]> {
  const db = await useDb()
  if (seesEveryFundusPhoto(user)) return (await db.selectFrom('cohorts').select('id').execute()).map(r => r.id)
  return cohortIdsOf(user.id)
}
