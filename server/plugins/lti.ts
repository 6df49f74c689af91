// LTI 1.3: makes the tool's signing key on start (so /api/lti/jwks has a key before the
// first platform asks), and retries scores waiting for a learning platform, on the same
// clock and back-off as the mail jobs.
import { ensureToolKey } from '~~/server/lib/lti/keys'
import { deliverDueGrades } from '~~/server/lib/lti/grades'

export default defineNitroPlugin((nitro) => {
  const base = () => Number(useRuntimeConfig().mailRetrySeconds) || 30
  useDb().then(db => ensureToolKey(db)).catch(error => console.error(`[lti] could not make the signing key: ${error instanceof Error ? error.message : error}`))
  const timer = setInterval(() => {
    useDb().then(db => deliverDueGrades(db, base()))
      .catch(error => console.error(`[lti] grade loop: ${error instanceof Error ? error.message : error}`))
  }, Math.max(1, Math.min(30, base())) * 1000)
  timer.unref()
  nitro.hooks.hook('close', () => clearInterval(timer))
})
