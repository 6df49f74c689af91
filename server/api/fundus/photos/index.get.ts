// The fundus photograph library. Staff see what they uploaded, what is shared with
// their cohorts (lecturers and admins: everything) and the cohorts they may share
// with; students see the marked photographs shared with their cohort, to practise on.
import { NORMAL_RANGES } from '#shared/engine/fundus/normals'
import type { FundusPhotoList } from '#shared/types/fundus'
import { photosHeldForQuiz, seesEveryFundusPhoto, shareableCohortIds } from '~~/server/lib/fundus/photo-access'
import { cohortIdsOf } from '~~/server/lib/roster/cohorts'
import { fundusPhotoViews } from '~~/server/lib/fundus/photo-view'

export default defineEventHandler(async (event): Promise<FundusPhotoList> => {
  const user = await requireSignedIn(event)
  const db = await useDb()
  let q = db.selectFrom('fundus_photos').selectAll().orderBy('created_at', 'desc').orderBy('id', 'desc')
  if (!seesEveryFundusPhoto(user)) {
    const mine = await cohortIdsOf(user.id)
    q = q.where(eb => eb.or([
      eb('owner_id', '=', user.id),
      eb('id', 'in', eb.selectFrom('fundus_photo_cohorts').select('photo_id').where('cohort_id', 'in', mine.length ? mine : [-1])),
    ]))
  }
  if (user.role === 'student') {
    q = q.where('reference_angle', 'is not', null)
    // a photograph in a quiz the student is sitting stays out of the library until its feedback opens
    const held = [...await photosHeldForQuiz(db, user)]
    if (held.length) q = q.where('id', 'not in', held)
  }
  const rows = await q.limit(500).execute()
  const shareIds = user.role === 'student' ? [] : await shareableCohortIds(user)
  const shareable = shareIds.length ? await db.selectFrom('cohorts').select(['id', 'name']).where('id', 'in', shareIds).orderBy('name').execute() : []
  return {
    items: await fundusPhotoViews(user, rows),
    shareable,
    normalRanges: NORMAL_RANGES,
  }
})
