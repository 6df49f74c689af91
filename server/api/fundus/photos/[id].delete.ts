// Delete a photograph (its uploader, a lecturer or an admin): the row, its shares and
// the measurements made on it go in one transaction, then the stored object.
import { idParam } from '#shared/schemas/common'
import { deleteFundusPhoto, fundusPhotoStorage } from '~~/server/lib/fundus/photo-store'
import { fundusPhotoFor, managesFundusPhoto, photoItemsQuery } from '~~/server/lib/fundus/photo-access'
import type { FundusPhotoDeleted } from '#shared/types/fundus'

export default defineEventHandler(async (event): Promise<FundusPhotoDeleted> => {
  const user = await requireRole(event, 'tutor', 'lecturer', 'admin')
  const { id } = paramsAs(event, idParam)
  const photo = await fundusPhotoFor(user, id)
  if (!managesFundusPhoto(user, photo)) {
    throw createError({ statusCode: 403, message: 'Only the tutor who uploaded this photograph, a lecturer or an admin can delete it.', data: { code: 'not-yours' } })
  }
  // a quiz item serves its pixels and grades against its snapshot: keep it while any item uses it
  const db = await useDb()
  const used = await photoItemsQuery(db, id).innerJoin('quizzes as q', 'q.id', 'qi.quiz_id').select(['q.title']).execute()
  if (used.length) {
    const titles = [...new Set(used.map(u => `“${u.title}”`))].join(', ')
    throw createError({ statusCode: 409, message: `This photograph is an item of ${used.length === 1 ? 'the quiz' : 'the quizzes'} ${titles}; remove the item before deleting it.`, data: { code: 'used-by-quiz' } })
  }
  await deleteFundusPhoto(db, fundusPhotoStorage(), photo, user.id)
  return { deleted: id }
})
