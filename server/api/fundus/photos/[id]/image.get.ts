// The photograph's bytes, only for signed-in people allowed to see it — the library
// rule, or a quiz that uses the photograph (fundusPhotoImageFor) — others: 404.
// Served from the photo storage (a private folder or bucket), never from public/,
// and never cached by shared caches.
import { idParam } from '#shared/schemas/common'
import { isStorageName } from '~~/server/lib/fundus/photo-file'
import { fundusPhotoStorage } from '~~/server/lib/fundus/photo-store'
import { fundusPhotoImageFor } from '~~/server/lib/fundus/photo-access'

export default defineEventHandler(async (event): Promise<Buffer> => {
  const user = await requireSignedIn(event)
  const { id } = paramsAs(event, idParam)
  const photo = await fundusPhotoImageFor(user, id)
  const bytes = isStorageName(photo.storage_name)
    ? await fundusPhotoStorage().get(photo.storage_name).catch((error: unknown) => {
        console.error(`[fundus] reading photo ${photo.id}: ${error instanceof Error ? error.message : error}`)
        return null
      })
    : null
  if (!bytes) notFound('That fundus photograph\'s file')
  setResponseHeaders(event, {
    'Content-Type': photo.mime,
    'Content-Length': String(bytes.length),
    'Cache-Control': 'private, no-store',
    'Content-Disposition': 'inline',
    'X-Content-Type-Options': 'nosniff',
  })
  return bytes
})
