// The uploader (or a lecturer or admin) marks the reference disc centre and fovea,
// in image pixels; the reference angle is computed here.
import { idParam } from '#shared/schemas/common'
import { discFoveaAngle } from '#shared/engine/fundus/geometry'
import { photoReferenceBody } from '#shared/schemas/fundus'
import { fundusPhotoFor, managesFundusPhoto } from '~~/server/lib/fundus/photo-access'
import { assertMarksOnPicture } from '~~/server/lib/fundus/attempts'
import { fundusPhotoViews } from '~~/server/lib/fundus/photo-view'
import type { FundusPhotoView } from '#shared/types/fundus'

export default defineEventHandler(async (event): Promise<FundusPhotoView> => {
  const user = await requireRole(event, 'tutor', 'lecturer', 'admin')
  const { id } = paramsAs(event, idParam)
  const body = await readBodyAs(event, photoReferenceBody)
  const photo = await fundusPhotoFor(user, id)
  if (!managesFundusPhoto(user, photo)) {
    throw createError({ statusCode: 403, message: 'Only the tutor who uploaded this photograph, a lecturer or an admin can mark it.', data: { code: 'not-yours' } })
  }
  assertMarksOnPicture({ '': body }, { width: photo.width, height: photo.height }, '')
  const angle = Math.round(discFoveaAngle(photo.eye, body.disc, body.fovea) * 10) / 10
  if (Math.abs(angle) > 45) {
    badRequest([{ path: 'fovea', message: `These marks make ${angle}°: the fovea must lie on the temporal side of the disc (${photo.eye === 'RE' ? 'to its left on a right eye' : 'to its right on a left eye'}). Check the marks, and that the photograph is of the ${photo.eye === 'RE' ? 'right' : 'left'} eye.` }])
  }
  const db = await useDb()
  const now = nowIso()
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('fundus_photos').set({
      disc_x: body.disc.x,
      disc_y: body.disc.y,
      fovea_x: body.fovea.x,
      fovea_y: body.fovea.y,
      reference_angle: angle,
      marked_at: now,
      updated_at: now,
    }).where('id', '=', id).execute()
    await writeAudit(trx, { actorId: user.id, action: 'fundus-photo.marked', targetType: 'fundus-photo', targetId: id, detail: { angle } })
  })
  const [view] = await fundusPhotoViews(user, [{ ...photo, disc_x: body.disc.x, disc_y: body.disc.y, fovea_x: body.fovea.x, fovea_y: body.fovea.y, reference_angle: angle, marked_at: now, updated_at: now }])
  return view!
})
