import { fundusPhotoStorage } from '~~/server/utils/fundus/photoStore'

// Start-up checks: refuse to serve in production without a session password (or with
// one that is long but trivially weak) or without a site URL, then open, migrate and
// (when asked) seed the database straight away. A photo storage setting that
// cannot work (NUXT_PHOTO_STORAGE=s3 without a bucket) also stops it.
export default defineNitroPlugin(() => {
  const password = String(useRuntimeConfig().session?.password ?? '')
  const problem = import.meta.dev ? null : sessionPasswordProblem(password)
  if (problem) {
    console.error(`[cyclodial] ${problem} Refusing to start.`)
    process.exit(1)
  }
  // Links in e-mails (reset, invitation, release, practice set) are built from
  // this origin only, never from the request's Host or X-Forwarded-* headers.
  if (!import.meta.dev && !configuredSiteOrigin()) {
    console.error('[cyclodial] NUXT_PUBLIC_SITE_URL must be set to the site\'s public origin (e.g. https://cyclodial.example.ac.uk) in production. Refusing to start.')
    process.exit(1)
  }
  // a wrong photo storage setting stops the server now, not at the first upload
  try {
    fundusPhotoStorage()
  }
  catch (error) {
    console.error(`[cyclodial] photo storage: ${error instanceof Error ? error.message : error} Refusing to start.`)
    process.exit(1)
  }
  useDb().catch((error) => {
    console.error(`[cyclodial] database start-up failed: ${error instanceof Error ? error.message : error}`)
    process.exit(1)
  })
})
