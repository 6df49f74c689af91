// Every request with a session cookie is checked against the sessions table
// before any route runs, so the module's own /api/_auth/session and every API
// route see a revoked, idle or expired session as signed out (server/utils/sessions.ts).
export default defineEventHandler(async (event) => {
  await resolveSession(event)
})
