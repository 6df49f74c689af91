// Signing out revokes this session on the server, not only the browser's cookie.
export default defineEventHandler(async (event) => {
  await endSession(event)
  return { ok: true }
})
