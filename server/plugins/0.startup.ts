// Start-up checks: refuse to serve in production without a session password, or
// with one that is long but trivially weak, then open, migrate and (when asked)
// seed the database straight away.
export default defineNitroPlugin(() => {
  const password = String(useRuntimeConfig().session?.password ?? '')
  const problem = import.meta.dev ? null : sessionPasswordProblem(password)
  if (problem) {
    console.error(`[cyclodial] ${problem} Refusing to start.`)
    process.exit(1)
  }
  useDb().catch((error) => {
    console.error(`[cyclodial] database start-up failed: ${error instanceof Error ? error.message : error}`)
    process.exit(1)
  })
})
