// Whatever clears the session cookie through nuxt-auth-utils (sign-out, and the
// module's own DELETE /api/_auth/session that its `clear()` calls) also revokes
// the session on the server, so a kept copy of the cookie stops working.
export default defineNitroPlugin(() => {
  sessionHooks.hook('clear', async (session) => {
    const sid = (session as { secure?: { sid?: unknown } } | undefined)?.secure?.sid
    if (typeof sid !== 'string') return
    const db = await useDb()
    await db.updateTable('sessions').set({ revoked_at: nowIso() }).where('id', '=', sid).where('revoked_at', 'is', null).execute()
  })
})
