// The photograph's bytes, only for signed-in people allowed to see it — the library
// rule, or a quiz that uses the photograph (fundusPhotoImageFor) — others: 404.
// Served from the data folder, never from public/, and never cached by shared caches.
import { idParam } from '#shared/schemas/common'
import { readFile } from 'node:fs/promises'
import { fundusPhotoDirFor, storagePath } from '~~/server/lib/fundus/photo-file'
import { fundusPhotoImageFor } from '~~/server/lib/fundus/photo-access'

export default defineEventHandler(async (event) => {
  const user = await requireSignedIn(event)
  const { id } = paramsAs(event, idParam)
  const photo = await fundusPhotoImageFor(user, id)
  const bytes = await readFile(storagePath(fundusPhotoDirFor(useRuntimeConfig()), photo.storage_name)).catch(() => null)
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
