import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import sharp from 'sharp'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { migrateToLatest, openDatabase } from '~~/db/open'
import type { PhotoStorage } from '~~/server/lib/storage/photo-storage'
import { startS3Fake, type S3Fake } from '../../support/s3-fake'

// Nitro auto-imports server utilities; a plain unit test supplies the one audit.ts uses.
vi.stubGlobal('nowIso', () => new Date().toISOString())
const { cleanImage, sniffImageType } = await import('~~/server/lib/fundus/photo-file')
const { deleteFundusPhoto, storeFundusPhoto } = await import('~~/server/lib/fundus/photo-store')
const { localPhotoStorage } = await import('~~/server/lib/storage/local')
const { photoStorageFrom } = await import('~~/server/lib/storage/photo-storage')

const dir = mkdtempSync(join(tmpdir(), 'cyclodial-fundus-store-'))
const photoDir = join(dir, 'fundus-photos')
const db = openDatabase(join(dir, 'test.sqlite'))
let ownerId = 0
let fake: S3Fake

beforeAll(async () => {
  fake = await startS3Fake()
  await migrateToLatest(db)
  const now = new Date().toISOString()
  ownerId = (await db.insertInto('users').values({ email: 't@x.test', name: 'T', role: 'tutor', password_hash: 'x', disabled: 0, created_at: now, updated_at: now, last_login_at: null }).returning('id').executeTakeFirstOrThrow()).id
})
afterAll(async () => {
  await fake.stop()
  await db.destroy()
  rmSync(dir, { recursive: true, force: true })
})

const png = () => sharp({ create: { width: 40, height: 30, channels: 3, background: { r: 190, g: 80, b: 40 } } }).png().toBuffer()
const files = () => {
  try {
    return readdirSync(photoDir)
  }
  catch {
    return []
  }
}

/** The S3 driver as the server builds it from NUXT_S3_* settings, against the fake. */
function s3Storage(bucket = fake.bucket): PhotoStorage {
  return photoStorageFrom({
    photoStorage: 's3',
    s3: { bucket, region: 'us-east-1', endpoint: fake.endpoint, accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', forcePathStyle: '1', prefix: 'photos/' },
  }, '/nowhere')
}
/** Object keys in the fake's bucket, through a plain S3 ListObjectsV2. */
async function objects(): Promise<string[]> {
  const { ListObjectsV2Command, S3Client } = await import('@aws-sdk/client-s3')
  const client = new S3Client({ region: 'us-east-1', endpoint: fake.endpoint, forcePathStyle: true, credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' } })
  const out = await client.send(new ListObjectsV2Command({ Bucket: fake.bucket }))
  return (out.Contents ?? []).map(o => o.Key!).sort()
}

describe('type from the bytes', () => {
  it('knows JPEG (FF D8 FF) and PNG (89 50 4E 47 0D 0A 1A 0A) and nothing else', async () => {
    // ISO/IEC 10918-1 (JPEG SOI marker) and ISO/IEC 15948 (PNG signature)
    expect(sniffImageType(await png())).toBe('image/png')
    expect(sniffImageType(Uint8Array.from([0xFF, 0xD8, 0xFF, 0xE1, 0, 0]))).toBe('image/jpeg')
    expect(sniffImageType(new TextEncoder().encode('GIF89a....'))).toBeNull()
    expect(sniffImageType(new TextEncoder().encode('<svg xmlns="http://www.w3.org/2000/svg"/>'))).toBeNull()
    expect(sniffImageType(new Uint8Array())).toBeNull()
  })
})

interface Driver { name: string, storage: () => PhotoStorage, stored: () => Promise<string[]>, key: (name: string) => string }
const drivers: Driver[] = [
  { name: 'local folder', storage: () => localPhotoStorage(photoDir), stored: async () => files(), key: n => n },
  { name: 'S3 (local fake)', storage: () => s3Storage(), stored: objects, key: n => `photos/${n}` },
]

describe.each(drivers)('storing a photograph on the $name driver: object and row together or not at all', (driver) => {
  it('stores the object under a random name and the row with its cohorts; serves and deletes it', async () => {
    const storage = driver.storage()
    const image = await cleanImage(await png(), 'image/png')
    const row = await storeFundusPhoto(db, storage, { ownerId, title: `Stored ${driver.name}`, eye: 'LE', notes: null, cohortIds: [], image })
    expect(await driver.stored()).toEqual([driver.key(row.storage_name)])
    expect(row).toMatchObject({ width: 40, height: 30, mime: 'image/png', eye: 'LE' })
    expect(Buffer.compare((await storage.get(row.storage_name))!, image.bytes)).toBe(0)
    const audit = await db.selectFrom('audit_log').selectAll().where('action', '=', 'fundus-photo.uploaded').where('detail', 'like', `%${driver.name}%`).execute()
    expect(audit).toHaveLength(1)
    await deleteFundusPhoto(db, storage, row, ownerId)
    expect(await driver.stored()).toEqual([])
    expect(await storage.get(row.storage_name)).toBeNull()
    expect(await db.selectFrom('fundus_photos').selectAll().execute()).toEqual([])
  })

  it('leaves no object, no temporary and no row when the database refuses the row', async () => {
    const image = await cleanImage(await png(), 'image/png')
    // a cohort that does not exist breaks the foreign key inside the transaction, after the object was stored
    await expect(storeFundusPhoto(db, driver.storage(), { ownerId, title: 'Broken', eye: 'RE', notes: null, cohortIds: [424242], image })).rejects.toThrow(/FOREIGN KEY/)
    expect(await driver.stored()).toEqual([])
    expect(await db.selectFrom('fundus_photos').selectAll().execute()).toEqual([])
    expect(await db.selectFrom('audit_log').selectAll().where('detail', 'like', '%Broken%').execute()).toEqual([])
  })
})

describe('a storage that refuses the object', () => {
  it('S3: a bucket that does not exist stores nothing and writes no row', async () => {
    const image = await cleanImage(await png(), 'image/png')
    await expect(storeFundusPhoto(db, s3Storage('no-such-bucket'), { ownerId, title: 'Nowhere', eye: 'RE', notes: null, cohortIds: [], image })).rejects.toThrow()
    expect(await objects()).toEqual([])
    expect(await db.selectFrom('fundus_photos').selectAll().execute()).toEqual([])
  })

  it('local: a folder that cannot be made stores nothing and writes no row', async () => {
    const image = await cleanImage(await png(), 'image/png')
    // a regular file stands where the folder should be
    const blocked = join(dir, 'blocked')
    writeFileSync(blocked, 'not a folder')
    await expect(storeFundusPhoto(db, localPhotoStorage(join(blocked, 'photos')), { ownerId, title: 'Blocked', eye: 'RE', notes: null, cohortIds: [], image })).rejects.toThrow()
    expect(await db.selectFrom('fundus_photos').selectAll().execute()).toEqual([])
  })

  it('names a missing or wrong setting', () => {
    expect(() => photoStorageFrom({ photoStorage: 's3', s3: {} }, '/x')).toThrow(/NUXT_S3_BUCKET/)
    expect(() => photoStorageFrom({ photoStorage: 's3', s3: { bucket: 'b', accessKeyId: 'k' } }, '/x')).toThrow(/NUXT_S3_SECRET_ACCESS_KEY/)
    expect(() => photoStorageFrom({ photoStorage: 'ftp' }, '/x')).toThrow(/NUXT_PHOTO_STORAGE/)
    expect(photoStorageFrom({}, '/x').kind).toBe('local')
  })

  it('refuses a name that could leave the folder or the prefix', async () => {
    await expect(localPhotoStorage(photoDir).get('../secret')).rejects.toThrow(/storage name/)
    await expect(s3Storage().put('a/b.jpg', Buffer.from('x'), 'image/jpeg')).rejects.toThrow(/storage name/)
  })
})
