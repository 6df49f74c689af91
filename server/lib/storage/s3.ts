// The S3-compatible driver (AWS SDK for JavaScript v3). A PutObject is atomic on
// S3 and on compatible stores: the object appears whole or not at all. Objects are
// private (no ACL is ever sent); the image route streams them to allowed people.
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3'
import type { PhotoStorage } from './photo-storage'

export interface S3Settings {
  bucket: string
  region: string
  endpoint?: string
  accessKeyId?: string
  secretAccessKey?: string
  forcePathStyle: boolean
  prefix: string
}

export function s3PhotoStorage(settings: S3Settings): PhotoStorage {
  const client = new S3Client({
    region: settings.region,
    endpoint: settings.endpoint,
    forcePathStyle: settings.forcePathStyle,
    credentials: settings.accessKeyId && settings.secretAccessKey
      ? { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey }
      : undefined,
    // Checksums only where S3 requires them: many S3-compatible stores do not
    // accept the SDK's default streaming checksum trailers (aws-chunked uploads).
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    maxAttempts: 3,
  })
  const key = (name: string) => {
    if (!/^[\w-][\w.-]*$/.test(name) || name.includes('..')) throw new Error('Not a storage name.')
    return `${settings.prefix}${name}`
  }
  return {
    kind: 's3',
    async put(name, bytes, contentType) {
      await client.send(new PutObjectCommand({ Bucket: settings.bucket, Key: key(name), Body: bytes, ContentType: contentType, ContentLength: bytes.length }))
    },
    async get(name) {
      try {
        const out = await client.send(new GetObjectCommand({ Bucket: settings.bucket, Key: key(name) }))
        if (!out.Body) return null
        return Buffer.from(await out.Body.transformToByteArray())
      }
      catch (error) {
        const e = error as { name?: string, $metadata?: { httpStatusCode?: number } }
        if (e.name === 'NoSuchKey' || e.$metadata?.httpStatusCode === 404) return null
        throw error
      }
    },
    async remove(name) {
      // DeleteObject succeeds for a missing key as well (S3 API reference, DeleteObject)
      await client.send(new DeleteObjectCommand({ Bucket: settings.bucket, Key: key(name) }))
    },
  }
}
