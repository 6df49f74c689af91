import { mkdtempSync, readdirSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import sharp from 'sharp'
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { migrateToLatest, openDatabase } from '~~/db/open'

// Nitro auto-imports server utilities; a plain unit test supplies the one audit.ts uses.
vi.stubGlobal('nowIso', () => new Date().toISOString())
const { cleanImage, sniffImageType } = await import('~~/server/lib/fundus/photo-file')
const { deleteFundusPhoto, storeFundusPhoto } = await import('~~/server/lib/fundus/photo-store')

const dir = mkdtempSync(join(tmpdir(), 'cyclodial-fundus-store-'))
const photoDir = join(dir, 'fundus-photos')
const db = openDatabase(join(dir, 'test.sqlite'))
let ownerId = 0

beforeAll(async () => {
  await migrateToLatest(db)
  const now = new Date().toISOString()
  ownerId = (await db.insertInto('users').values({ email: 't@x.test', name: 'T', role: 'tutor', password_hash: 'x', disabled: 0, created_at: now, updated_at: now, last_login_at: null }).returning('id').executeTakeFirstOrThrow()).id
})
afterAll(async () => {
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

describe('storing a photograph: file and row together or not at all', () => {
  it('stores the file under a random name and the row with its cohorts', async () => {
    const image = await cleanImage(await png(), 'image/png')
    const row = await storeFundusPhoto(db, photoDir, { ownerId, title: 'Stored', eye: 'LE', notes: null, cohortIds: [], image })
    expect(files()).toEqual([row.storage_name])
    expect(row).toMatchObject({ width: 40, height: 30, mime: 'image/png', eye: 'LE' })
    const audit = await db.selectFrom('audit_log').selectAll().where('action', '=', 'fundus-photo.uploaded').execute()
    expect(audit).toHaveLength(1)
    await deleteFundusPhoto(db, photoDir, row, ownerId)
    expect(files()).toEqual([])
    expect(await db.selectFrom('fundus_photos').selectAll().execute()).toEqual([])
  })

  it('leaves no file, no temporary and no row when the database refuses the row', async () => {
    const image = await cleanImage(await png(), 'image/png')
    // a cohort that does not exist breaks the foreign key inside the transaction, after the file was written
    await expect(storeFundusPhoto(db, photoDir, { ownerId, title: 'Broken', eye: 'RE', notes: null, cohortIds: [424242], image })).rejects.toThrow(/FOREIGN KEY/)
    expect(files()).toEqual([])
    expect(await db.selectFrom('fundus_photos').selectAll().execute()).toEqual([])
    expect(await db.selectFrom('audit_log').selectAll().where('detail', 'like', '%Broken%').execute()).toEqual([])
  })
})
