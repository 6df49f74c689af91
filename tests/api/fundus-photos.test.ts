import { readdirSync, readFileSync } from 'node:fs'
import { dirname, join } from 'node:path'
import sharp from 'sharp'
import { describe, expect, inject, it } from 'vitest'
import type { FundusPhotoList, FundusPhotoView, PhotoFundusAttemptReply } from '#shared/types/fundus'
import { Client, DEMO, signedIn } from '../support/client'
import { SYNTHETIC_PHOTO, countRows, jpegWithExif, syntheticPng } from '../support/fundus'

const baseURL = inject('baseURL')
const dbPath = inject('dbPath')
const photoDir = join(dirname(dbPath), 'fundus-photos')
const HERON_STUDENT = 'milo.strathearn@cyclodial.test'

const filesOnDisk = (): string[] => {
  try {
    return readdirSync(photoDir)
  }
  catch {
    return []
  }
}

function form(file: { bytes: Buffer, name: string, type: string } | null, fields: Record<string, string | string[]> = {}): FormData {
  const f = new FormData()
  if (file) f.append('file', new Blob([new Uint8Array(file.bytes)], { type: file.type }), file.name)
  const all: Record<string, string | string[]> = { title: 'Right fundus, teaching set', eye: 'RE', consent: 'yes', ...fields }
  for (const [k, v] of Object.entries(all)) for (const one of [v].flat()) f.append(k, one)
  return f
}

/** The body is a FundusPhotoView on success and an error object on refusal. */
async function upload(client: Client, file: { bytes: Buffer, name: string, type: string } | null, fields: Record<string, string | string[]> = {}) {
  return client.postForm<FundusPhotoView & { message: string, data: { code: string, fields: { path: string }[] } }>('/api/fundus/photos', form(file, fields))
}

describe('uploading fundus photographs', () => {
  it('stores a PNG outside public/, re-encoded, shared with the tutor\'s cohort', async () => {
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const reply = await upload(tutor, { bytes: await syntheticPng(), name: 'fundus.png', type: 'image/png' })
    expect(reply.status).toBe(201)
    expect(reply.body).toMatchObject({ eye: 'RE', width: 640, height: 480, marked: false, mine: true })
    expect(reply.body.cohorts.map(c => c.name)).toEqual(['Kestrel cohort'])
    const image = await tutor.bytes(reply.body.imageUrl)
    expect(image.status).toBe(200)
    expect(image.headers.get('content-type')).toBe('image/png')
    expect(image.headers.get('cache-control')).toMatch(/private/)
    expect((await sharp(image.body).metadata()).format).toBe('png')
    // never reachable as a static file
    const stored = filesOnDisk().find(n => n.endsWith('.png'))!
    expect(stored).toMatch(/^[0-9a-f-]{36}\.png$/)
    for (const path of [`/${stored}`, `/fundus-photos/${stored}`]) {
      const direct = await fetch(`${baseURL}${path}`, { redirect: 'manual' })
      expect(direct.headers.get('content-type') ?? '').not.toMatch(/^image\//)
    }
  })

  it('judges the type from the bytes: a PNG named .jpg is accepted as a PNG; a text file named .jpg is refused', async () => {
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const renamed = await upload(tutor, { bytes: await syntheticPng(), name: 'photo.jpg', type: 'image/jpeg' })
    expect(renamed.status).toBe(201)
    expect((await tutor.bytes(renamed.body.imageUrl)).headers.get('content-type')).toBe('image/png')

    const files = filesOnDisk().length
    const rows = countRows(dbPath, 'fundus_photos')
    const text = await upload(tutor, { bytes: Buffer.from('Name: Ada Exemplar\nThis is not a picture.\n'), name: 'fundus.jpg', type: 'image/jpeg' })
    expect(text.status).toBe(415)
    expect(text.body.data.code).toBe('not-an-image')
    expect(text.body.data.fields[0]!.path).toBe('file')
    expect(text.body.message).toMatch(/JPEG or PNG/)
    const damaged = await upload(tutor, { bytes: Buffer.concat([Buffer.from([0xFF, 0xD8, 0xFF, 0xE0]), Buffer.alloc(2000, 7)]), name: 'cut.jpg', type: 'image/jpeg' })
    expect(damaged.status).toBe(415)
    expect(damaged.body.data.code).toBe('unreadable-image')
    expect(filesOnDisk()).toHaveLength(files) // nothing half-stored, no temporary left behind
    expect(countRows(dbPath, 'fundus_photos')).toBe(rows)
  })

  it('refuses a file over 10 MB, a missing file, missing consent and a cohort the tutor does not teach', async () => {
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const files = filesOnDisk().length
    const rows = countRows(dbPath, 'fundus_photos')
    const big = Buffer.alloc(10 * 1024 * 1024 + 1, 0)
    big.set([0xFF, 0xD8, 0xFF, 0xE0])
    const tooLarge = await upload(tutor, { bytes: big, name: 'big.jpg', type: 'image/jpeg' })
    expect(tooLarge.status).toBe(413)
    expect(tooLarge.body.message).toMatch(/10 MB/)

    const noFile = await upload(tutor, null)
    expect(noFile.status).toBe(400)
    expect(noFile.body.data.fields[0]!.path).toBe('file')

    const png = await syntheticPng()
    const noConsent = await upload(tutor, { bytes: png, name: 'a.png', type: 'image/png' }, { consent: '' })
    expect(noConsent.status).toBe(400)
    expect(noConsent.body.data.fields.map(f => f.path)).toContain('consent')

    const cohorts = (await (await signedIn(baseURL, DEMO.admin)).get('/api/admin/cohorts')).body.items as { id: number, name: string }[]
    const heron = cohorts.find(c => c.name.startsWith('Heron'))!.id
    const wrongCohort = await upload(tutor, { bytes: png, name: 'a.png', type: 'image/png' }, { cohortIds: [String(heron)] })
    expect(wrongCohort.status).toBe(400)
    expect(wrongCohort.body.data.fields[0]!.path).toBe('cohortIds')

    const json = await tutor.post('/api/fundus/photos', { title: 'x' })
    expect(json.status).toBe(400)
    expect(json.body.data.code).toBe('not-multipart')

    expect(filesOnDisk()).toHaveLength(files)
    expect(countRows(dbPath, 'fundus_photos')).toBe(rows)
  })

  it('refuses strangers and students', async () => {
    const png = await syntheticPng()
    expect((await upload(new Client(baseURL), { bytes: png, name: 'a.png', type: 'image/png' })).status).toBe(401)
    expect((await upload(await signedIn(baseURL, DEMO.student), { bytes: png, name: 'a.png', type: 'image/png' })).status).toBe(403)
  })

  it('strips EXIF and every other metadata block from a JPEG', async () => {
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const original = await jpegWithExif()
    expect((await sharp(original).metadata()).exif).toBeDefined()
    expect(original.includes(Buffer.from('Ada Exemplar'))).toBe(true)
    const reply = await upload(tutor, { bytes: original, name: 'exif.jpg', type: 'image/jpeg' })
    expect(reply.status).toBe(201)
    const fetched = (await tutor.bytes(reply.body.imageUrl)).body
    const onDisk = filesOnDisk().filter(n => n.endsWith('.jpg')).map(n => readFileSync(join(photoDir, n)))
    expect(onDisk.some(b => b.equals(fetched))).toBe(true)
    const meta = await sharp(fetched).metadata()
    expect(meta.format).toBe('jpeg')
    expect(meta.exif).toBeUndefined()
    expect(meta.xmp).toBeUndefined()
    expect(meta.iptc).toBeUndefined()
    expect(fetched.includes(Buffer.from('Exif'))).toBe(false)
    expect(fetched.includes(Buffer.from('Ada Exemplar'))).toBe(false)
    expect(fetched.includes(Buffer.from('Clinic camera'))).toBe(false)
  })
})

describe('who may see a photograph', () => {
  it('serves it to its cohort, lecturers and admins; a student or tutor of another cohort gets 404', async () => {
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const { body: photo } = await upload(tutor, { bytes: await syntheticPng(), name: 'share.png', type: 'image/png' }, { title: 'Shared with Kestrel' })
    for (const email of [DEMO.student, DEMO.lecturer, DEMO.admin]) {
      const c = await signedIn(baseURL, email)
      expect((await c.bytes(photo.imageUrl)).status, email).toBe(200)
    }
    for (const email of [HERON_STUDENT, DEMO.tutor2]) {
      const c = await signedIn(baseURL, email)
      expect((await c.bytes(photo.imageUrl)).status, email).toBe(404)
      expect((await c.get(`/api/fundus/photos/${photo.id}`)).status, email).toBe(404)
      const list = (await c.get<FundusPhotoList>('/api/fundus/photos')).body
      expect(list.items.map(i => i.id)).not.toContain(photo.id)
    }
    expect((await new Client(baseURL).bytes(photo.imageUrl)).status).toBe(401)
  })
})

describe('reference marks and measuring a photograph', () => {
  it('the tutor marks it once; a student of the cohort measures it and is graded against the marks', async () => {
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const { body: photo } = await upload(tutor, { bytes: await syntheticPng(), name: 'mark.png', type: 'image/png' }, { title: 'Marked photograph', notes: 'From the teaching set.' })
    const student = await signedIn(baseURL, DEMO.student)
    // not marked yet: students neither list it nor can be graded on it
    expect((await student.get<FundusPhotoList>('/api/fundus/photos')).body.items.map(i => i.id)).not.toContain(photo.id)
    const early = await student.post(`/api/fundus/photos/${photo.id}/attempts`, { disc: SYNTHETIC_PHOTO.disc, fovea: SYNTHETIC_PHOTO.fovea, finding: 'within-normal' })
    expect(early.status).toBe(409)

    expect((await student.put(`/api/fundus/photos/${photo.id}/reference`, { disc: SYNTHETIC_PHOTO.disc, fovea: SYNTHETIC_PHOTO.fovea })).status).toBe(403)
    expect((await (await signedIn(baseURL, DEMO.tutor2)).put(`/api/fundus/photos/${photo.id}/reference`, { disc: SYNTHETIC_PHOTO.disc, fovea: SYNTHETIC_PHOTO.fovea })).status).toBe(404)
    const swapped = await tutor.put(`/api/fundus/photos/${photo.id}/reference`, { disc: SYNTHETIC_PHOTO.fovea, fovea: SYNTHETIC_PHOTO.disc })
    expect(swapped.status).toBe(400)
    expect(swapped.body.data.fields[0]!.path).toBe('fovea')
    const off = await tutor.put(`/api/fundus/photos/${photo.id}/reference`, { disc: { x: 700, y: 10 }, fovea: SYNTHETIC_PHOTO.fovea })
    expect(off.status).toBe(400)
    expect(off.body.data.fields[0]!.path).toBe('disc.x')

    const marked = await tutor.put<FundusPhotoView>(`/api/fundus/photos/${photo.id}/reference`, { disc: SYNTHETIC_PHOTO.disc, fovea: SYNTHETIC_PHOTO.fovea })
    expect(marked.status).toBe(200)
    // atan(25 / 200) = 7.1°: fovea 25 px below the disc centre, 200 px across (tan α = vertical / horizontal, R45)
    expect(marked.body.reference!.angle).toBeCloseTo(7.1, 1)

    const listed = (await student.get<FundusPhotoList>('/api/fundus/photos')).body.items.find(i => i.id === photo.id)!
    expect(listed.reference).toBeNull() // learners never get the answer
    expect(listed.notes).toBeNull()

    const attempt = await student.post<PhotoFundusAttemptReply>(`/api/fundus/photos/${photo.id}/attempts`, { disc: { x: 431, y: 221 }, fovea: { x: 229, y: 246 }, finding: 'within-normal' })
    expect(attempt.status).toBe(201)
    const re = attempt.body.result.eyes.RE!
    expect(Math.abs(re.measuredAngle - 7.1)).toBeLessThanOrEqual(1)
    expect(attempt.body.result.score).toBe(1)
    expect(attempt.body.notes).toBe('From the teaching set.')

    const heron = await signedIn(baseURL, HERON_STUDENT)
    expect((await heron.post(`/api/fundus/photos/${photo.id}/attempts`, { disc: SYNTHETIC_PHOTO.disc, fovea: SYNTHETIC_PHOTO.fovea, finding: 'within-normal' })).status).toBe(404)
  })

  it('deletes the photograph, its file and the measurements on it', async () => {
    const tutor = await signedIn(baseURL, DEMO.tutor)
    const { body: photo } = await upload(tutor, { bytes: await syntheticPng(), name: 'gone.png', type: 'image/png' }, { title: 'To be deleted' })
    const files = filesOnDisk().length
    expect((await (await signedIn(baseURL, DEMO.student)).delete(`/api/fundus/photos/${photo.id}`)).status).toBe(403)
    const deleted = await tutor.delete(`/api/fundus/photos/${photo.id}`)
    expect(deleted.status).toBe(200)
    expect(filesOnDisk()).toHaveLength(files - 1)
    expect((await tutor.bytes(photo.imageUrl)).status).toBe(404)
  })
})
