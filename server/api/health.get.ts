// Liveness and readiness: answers once the database is open and migrated.
export default defineEventHandler(async () => {
  const db = await useDb()
  await db.selectFrom('users').select('id').limit(1).execute()
  return { ok: true }
})
