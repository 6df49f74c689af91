// Upload a fundus photograph (multipart: file, title, eye, notes?, cohortIds*, consent).
// Refused clearly, and nothing stored, unless it is a JPEG or PNG by its own bytes,
// at most 10 MB, readable, and shared only with cohorts the uploader may share with.
import { photoUploadFields } from '#shared/schemas/fundus'
import { FUNDUS_PHOTO_MAX_BYTES, cleanImage, sniffImageType } from '~~/server/lib/fundus/photo-file'
import { fundusPhotoStorage, storeFundusPhoto } from '~~/server/lib/fundus/photo-store'
import { shareableCohortIds } from '~~/server/lib/fundus/photo-access'
import { fundusPhotoViews } from '~~/server/lib/fundus/photo-view'
import type { FundusPhotoView } from '#shared/types/fundus'

const MB = FUNDUS_PHOTO_MAX_BYTES / 1024 / 1024
/** Room for the form's text fields and multipart boundaries around the file. */
const FORM_OVERHEAD = 256 * 1024

function refuse(statusCode: number, code: string, message: string, path = 'file'): never {
  throw createError({ statusCode, message, data: { code, fields: [{ path, message }] } })
}

export default defineEventHandler(async (event): Promise<FundusPhotoView> => {
  const user = await requireRole(event, 'tutor', 'lecturer', 'admin')

  const declared = Number(getRequestHeader(event, 'content-length'))
  if (!Number.isFinite(declared)) refuse(411, 'length-required', 'Send the upload with its length (Content-Length).')
  if (declared > FUNDUS_PHOTO_MAX_BYTES + FORM_OVERHEAD) refuse(413, 'too-large', `The photograph is larger than ${MB} MB. Export it at a smaller size and try again.`)
  if (!(getRequestHeader(event, 'content-type') ?? '').toLowerCase().startsWith('multipart/form-data')) {
    refuse(400, 'not-multipart', 'Send the photograph as a form upload with a "file" field.')
  }

  const parts = await readMultipartFormData(event).catch(() => refuse(400, 'malformed-upload', 'The upload could not be read. Choose the file again and retry.'))
  const file = parts?.find(p => p.name === 'file' && p.filename !== undefined)
  if (!file || file.data.length === 0) refuse(400, 'file-missing', 'Choose a photograph to upload.')
  if (file.data.length > FUNDUS_PHOTO_MAX_BYTES) refuse(413, 'too-large', `The photograph is larger than ${MB} MB. Export it at a smaller size and try again.`)

  const text = (name: string) => parts!.filter(p => p.name === name && p.filename === undefined).map(p => p.data.toString('utf8'))
  const parsed = photoUploadFields.safeParse({
    title: text('title')[0],
    eye: text('eye')[0],
    notes: text('notes')[0] || undefined,
    cohortIds: text('cohortIds').filter(Boolean),
    consent: text('consent')[0],
  })
  if (!parsed.success) badRequest(zodProblems(parsed.error))
  const fields = parsed.data

  const allowed = await shareableCohortIds(user)
  const stray = fields.cohortIds.filter(id => !allowed.includes(id))
  if (stray.length) badRequest([{ path: 'cohortIds', message: `You cannot share with cohort ${stray.join(', ')}: choose from your own cohorts.` }])
  // a tutor who picks no cohort shares with every cohort they teach
  const cohortIds = fields.cohortIds.length || user.role !== 'tutor' ? fields.cohortIds : allowed

  const type = sniffImageType(file.data)
  if (!type) refuse(415, 'not-an-image', 'Only JPEG or PNG photographs can be uploaded. This file is neither (Cyclodial checks the file\'s contents, not its name).')
  const image = await cleanImage(file.data, type).catch(() =>
    refuse(415, 'unreadable-image', `The file starts like a ${type === 'image/png' ? 'PNG' : 'JPEG'} but cannot be read: it may be damaged or cut short.`))

  const db = await useDb()
  const row = await storeFundusPhoto(db, fundusPhotoStorage(), {
    ownerId: user.id,
    title: fields.title,
    eye: fields.eye,
    notes: fields.notes ?? null,
    cohortIds,
    image,
  })
  setResponseStatus(event, 201)
  const [view] = await fundusPhotoViews(user, [row])
  return view!
})
