// Storing and deleting an uploaded photograph so that the file and its row exist
// together or not at all: the cleaned bytes go to a temporary file first; the row,
// its cohorts and the audit entry are written in one transaction, and the file is
// renamed into place inside it; any failure removes whatever was written.

import type { Kysely } from 'kysely'
import type { Database, FundusPhotoRow } from '~~/db/schema'
import { writeAudit } from '~~/server/utils/audit'
import { nowIso } from '~~/server/utils/clock'
import type { CleanImage } from './photo-file'
import { moveIntoPlace, newStorageName, removeQuietly, storagePath, writeTemporary } from './photo-file'

export interface NewFundusPhoto {
  ownerId: number
  title: string
  eye: 'RE' | 'LE'
  notes: string | null
  cohortIds: number[]
  image: CleanImage
}

export async function storeFundusPhoto(db: Kysely<Database>, dir: string, input: NewFundusPhoto): Promise<FundusPhotoRow> {
  const name = newStorageName(input.image.type)
  const temp = await writeTemporary(dir, input.image.bytes)
  let placed = false
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
      await moveIntoPlace(dir, temp, name)
      placed = true
      return row
    })
  }
  catch (error) {
    await removeQuietly(temp)
    if (placed) await removeQuietly(storagePath(dir, name))
    throw error
  }
}

/** Deletes the row (its shares and attempts go with it) and then the file. */
export async function deleteFundusPhoto(db: Kysely<Database>, dir: string, photo: FundusPhotoRow, actorId: number): Promise<void> {
  await db.transaction().execute(async (trx) => {
    await trx.deleteFrom('fundus_photos').where('id', '=', photo.id).execute()
    await writeAudit(trx, { actorId, action: 'fundus-photo.deleted', targetType: 'fundus-photo', targetId: photo.id, detail: { title: photo.title } })
  })
  await removeQuietly(storagePath(dir, photo.storage_name))
}
