// One storage interface for uploaded fundus photographs, two drivers: a local
// folder (the default: one server) and S3-compatible object storage (several
// instances share it). Objects are named by the caller (fundus/photoFile.ts makes
// random UUID names) and reached only through the authorised image route; neither
// driver ever makes an object public.
//
// Configuration (runtimeConfig, so NUXT_… environment variables):
//   NUXT_PHOTO_STORAGE=local|s3   (default local)
//   local: NUXT_FUNDUS_PHOTO_DIR  (default: a fundus-photos folder beside the SQLite file)
//   s3:    NUXT_S3_BUCKET (required), NUXT_S3_REGION (default us-east-1),
//          NUXT_S3_ENDPOINT (for a non-AWS store, e.g. https://objects.example.org),
//          NUXT_S3_ACCESS_KEY_ID + NUXT_S3_SECRET_ACCESS_KEY (else the AWS SDK's own
//          credential chain), NUXT_S3_FORCE_PATH_STYLE=1 (most non-AWS stores),
//          NUXT_S3_PREFIX (default fundus-photos/)
import { localPhotoStorage } from './local'
import { s3PhotoStorage, type S3Settings } from './s3'

export interface PhotoStorage {
  /** 'local' or 's3', for logs and the health report. */
  readonly kind: 'local' | 's3'
  /** Stores the bytes under `name`, whole or not at all (never a half-written object under that name). */
  put: (name: string, bytes: Buffer, contentType: string) => Promise<void>
  /** The bytes, or null when there is no such object. */
  get: (name: string) => Promise<Buffer | null>
  /** Removes the object; no error when it is already gone. */
  remove: (name: string) => Promise<void>
}

export interface StorageConfig {
  photoStorage?: unknown
  fundusPhotoDir?: unknown
  dbPath?: unknown
  s3?: Partial<Record<keyof S3Settings, unknown>>
}

/** Reads the settings; throws a message naming the variable when one is missing or wrong. */
export function photoStorageFrom(config: StorageConfig, localDir: string): PhotoStorage {
  const kind = String(config.photoStorage ?? '').trim().toLowerCase() || 'local'
  if (kind === 'local') return localPhotoStorage(localDir)
  if (kind !== 's3') throw new Error(`NUXT_PHOTO_STORAGE must be "local" or "s3", not "${kind}".`)
  const s3 = config.s3 ?? {}
  const text = (v: unknown) => String(v ?? '').trim()
  const bucket = text(s3.bucket)
  if (!bucket) throw new Error('NUXT_PHOTO_STORAGE=s3 needs NUXT_S3_BUCKET.')
  const accessKeyId = text(s3.accessKeyId)
  const secretAccessKey = text(s3.secretAccessKey)
  if (Boolean(accessKeyId) !== Boolean(secretAccessKey)) throw new Error('Set both NUXT_S3_ACCESS_KEY_ID and NUXT_S3_SECRET_ACCESS_KEY, or neither (the AWS SDK then finds credentials itself).')
  const flag = text(s3.forcePathStyle).toLowerCase()
  return s3PhotoStorage({
    bucket,
    region: text(s3.region) || 'us-east-1',
    endpoint: text(s3.endpoint) || undefined,
    accessKeyId: accessKeyId || undefined,
    secretAccessKey: secretAccessKey || undefined,
    forcePathStyle: flag === '1' || flag === 'true',
    prefix: s3.prefix === undefined || s3.prefix === null ? 'fundus-photos/' : text(s3.prefix),
  })
}
