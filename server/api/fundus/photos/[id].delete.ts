// Delete a photograph (its uploader, a lecturer or an admin): the row, its shares and
// the measurements made on it go in one transaction, then the file.
import { idParam } from '#shared/schemas/admin'
import { fundusPhotoDirFor } from '~~/server/utils/fundus/photoFile'
import { deleteFundusPhoto } from '~~/server/utils/fundus/photoStore'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'tutor', 'lecturer', 'admin')
  const { id } = paramsAs(event, idParam)
  const photo = await fundusPhotoFor(user, id)
  if (!managesFundusPhoto(user, photo)) {
    throw createError({ statusCode: 403, message: 'Only the tutor who uploaded this photograph, a lecturer or an admin can delete it.', data: { code: 'not-yours' } })
  }
  await deleteFundusPhoto(await useDb(), fundusPhotoDirFor(useRuntimeConfig()), photo, user.id)
  return { deleted: id }
})
