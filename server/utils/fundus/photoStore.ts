// Storing and deleting an uploaded photograph so that the object and its row exist
// together or not at all. The cleaned bytes are stored first under a fresh random
// name (no row points at it yet, so nobody can reach it); then the row, its cohorts
// and the audit entry are written in one transaction; if that fails, the object is
// removed again. The storage is a local folder or S3-compatible object storage
// (server/lib/storage), the same for every instance that shares it.

import type { Kysely } from 'kysely'
import type { Database, FundusPhotoRow } from '~~/db/schema'
import { photoStorageFrom, type PhotoStorage } from '~~/server/lib/storage/photo-storage'
import { writeAudit } from '../audit'
import { nowIso } from '../clock'
import type { CleanImage } from './photoFile'
import { fundusPhotoDirFor, newStorageName } from './photoFile'

let configured: PhotoStorage | undefined
/** The configured photo storage (NUXT_PHOTO_STORAGE, see server/lib/storage/photo-storage.ts), made once. */
export function fundusPhotoStorage(): PhotoStorage {
  if (!configured) {
    const config = useRuntimeConfig()
    configured = photoStorageFrom(config, fundusPhotoDirFor(config))
  }
  return configured
}

export interface NewFundusPhoto {
  ownerId: number
  title: string
  eye: 'RE' | 'LE'
  notes: string | null
  cohortIds: number[]
  image: CleanImage
}

export async function storeFundusPhoto(db: Kysely<Database>, storage: PhotoStorage, input: NewFundusPhoto): Promise<FundusPhotoRow> {
  const name = newStorageName(input.image.type)
  // a failed put stores nothing (the drivers put whole objects or none) and writes no row
  await storage.put(name, input.image.bytes, input.image.type)
  try {
    return await db.transaction().execute(async (trx) => {
      const now = nowIso()
      const row = await trx.insertInto('fundus_photos').values({
        owner_id: input.ownerId,
        title: input.title,
        eye: input.eye,
        notes: input.notes,
        storage_name: name,
        mime: input.image.type,
        byte_size: input.image.bytes.length,
        width: input.image.width,
        height: input.image.height,
        disc_x: null,
        disc_y: null,
        fovea_x: null,
        fovea_y: null,
        reference_angle: null,
        marked_at: null,
        created_at: now,
        updated_at: now,
      }).returningAll().executeTakeFirstOrThrow()
      for (const cohortId of new Set(input.cohortIds)) {
        await trx.insertInto('fundus_photo_cohorts').values({ photo_id: row.id, cohort_id: cohortId }).execute()
      }
      await writeAudit(trx, { actorId: input.ownerId, action: 'fundus-photo.uploaded', targetType: 'fundus-photo', targetId: row.id, detail: { title: input.title, eye: input.eye, bytes: input.image.bytes.length, cohortIds: input.cohortIds } })
      return row
    })
  }
  catch (error) {
    await storage.remove(name).catch((removal: unknown) =>
      console.error(`[fundus] could not remove the unreferenced photo object ${name}: ${removal instanceof Error ? removal.message : removal}`))
    throw error
  }
}

/** Deletes the row (its shares and attempts go with it) and then the object. */
export async function deleteFundusPhoto(db: Kysely<Database>, storage: PhotoStorage, photo: FundusPhotoRow, actorId: number): Promise<void> {
  await db.transaction().execute(async (trx) => {
    await trx.deleteFrom('fundus_photos').where('id', '=', photo.id).execute()
    await writeAudit(trx, { actorId, action: 'fundus-photo.deleted', targetType: 'fundus-photo', targetId: photo.id, detail: { title: photo.title } })
  })
  // no row points at it any more: a failure here leaves an unreachable object, never a row without one
  await storage.remove(photo.storage_name).catch((error: unknown) =>
    console.error(`[fundus] could not remove photo object ${photo.storage_name}: ${error instanceof Error ? error.message : error}`))
}
