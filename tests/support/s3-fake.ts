// A local S3 fake (s3rver, from the npm registry) on loopback, with one bucket,
// for the S3 photo storage driver's tests. Its fixed credentials are s3rver's own
// (S3RVER / S3RVER, from its README).
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import S3rver from 's3rver'

export interface S3Fake {
  endpoint: string
  bucket: string
  /** The NUXT_… settings a server needs to use it. */
  env: Record<string, string>
  stop: () => Promise<void>
}

export async function startS3Fake(bucket = 'cyclodial-photos'): Promise<S3Fake> {
  const dir = mkdtempSync(join(tmpdir(), 'cyclodial-s3-'))
  const server = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory: dir, configureBuckets: [{ name: bucket }] })
  const { port } = await server.run()
  const endpoint = `http://127.0.0.1:${port}`
  return {
    endpoint,
    bucket,
    env: {
      NUXT_PHOTO_STORAGE: 's3',
      NUXT_S3_BUCKET: bucket,
      NUXT_S3_REGION: 'us-east-1',
      NUXT_S3_ENDPOINT: endpoint,
      NUXT_S3_ACCESS_KEY_ID: 'S3RVER',
      NUXT_S3_SECRET_ACCESS_KEY: 'S3RVER',
      NUXT_S3_FORCE_PATH_STYLE: '1',
    },
    stop: async () => {
      await server.close().catch(() => {})
      rmSync(dir, { recursive: true, force: true })
    },
  }
}
