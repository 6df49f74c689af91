// One fundus photograph's details, for anyone allowed to see it (others: 404).
import { idParam } from '#shared/schemas/common'
import { NORMAL_RANGES } from '#shared/engine/fundus/normals'
import { fundusPhotoFor } from '~~/server/lib/fundus/photo-access'
import { fundusPhotoViews } from '~~/server/lib/fundus/photo-view'
import { listFundusAttempts } from '~~/server/lib/fundus/attempts'
import type { FundusPhotoReply } from '#shared/types/fundus'

export default defineEventHandler(async (event): Promise<FundusPhotoReply> => {
  const user = await requireSignedIn(event)
  const { id } = paramsAs(event, idParam)
  const photo = await fundusPhotoFor(user, id)
  const [view] = await fundusPhotoViews(user, [photo])
  const attempts = await listFundusAttempts(user.id, { photoId: id })
  return { photo: view!, attempts, normalRanges: NORMAL_RANGES }
})
