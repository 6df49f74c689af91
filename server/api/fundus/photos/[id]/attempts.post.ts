// A learner measures an uploaded photograph: graded against the tutor's reference marks.
import { idParam } from '#shared/schemas/common'
import { photoFundusAttemptBody } from '#shared/schemas/fundus'
import { ddUnitFromMarks, gradeFundus } from '~~/server/lib/fundus/grade'
import { fundusPhotoFor } from '~~/server/lib/fundus/photo-access'
import { assertMarksOnPicture, storeFundusAttempt } from '~~/server/lib/fundus/attempts'
import { learnerCohortId } from '~~/server/lib/fundus/case-fundus'
import type { PhotoFundusAttemptReply } from '#shared/types/fundus'

export default defineEventHandler(async (event): Promise<PhotoFundusAttemptReply> => {
  const user = await requireSignedIn(event)
  const { id } = paramsAs(event, idParam)
  const body = await readBodyAs(event, photoFundusAttemptBody)
  const photo = await fundusPhotoFor(user, id)
  if (photo.reference_angle === null) {
    throw createError({ statusCode: 409, message: 'This photograph has no reference marks yet, so it cannot be graded.', data: { code: 'not-marked' } })
  }
  assertMarksOnPicture({ '': body }, { width: photo.width, height: photo.height }, '')
  const disc = { x: photo.disc_x!, y: photo.disc_y! }
  const fovea = { x: photo.fovea_x!, y: photo.fovea_y! }
  const result = gradeFundus({
    references: { [photo.eye]: { eye: photo.eye, disc, fovea, ddUnit: ddUnitFromMarks(disc, fovea) } },
    marks: { [photo.eye]: body },
    approximate: true,
  })
  const attempt = await storeFundusAttempt({
    learnerId: user.id,
    cohortId: await learnerCohortId(user),
    kind: 'practice',
    photoId: photo.id,
    marks: { [photo.eye]: body },
    result,
  })
  setResponseStatus(event, 201)
  return { attemptId: attempt.id, result, notes: photo.notes }
})
