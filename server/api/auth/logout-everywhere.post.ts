// POST /api/auth/logout-everywhere (signed in): `{ everywhere: true }` → `{ ended }`:
// ends every session of the signed-in person, this one included (*Sign out everywhere*
// in the header)
import { logoutEverywhereBody } from '#shared/schemas/auth'
import type { SignedOutEverywhere } from '#shared/types/admin'

// Sign out everywhere: ends every session of the signed-in person, this one
// included. The body must say so ({ "everywhere": true }), so a stray POST
// changes nothing.

export default defineEventHandler(async (event): Promise<SignedOutEverywhere> => {
  const user = await requireSignedIn(event)
  await readBodyAs(event, logoutEverywhereBody)
  const db = await useDb()
  const ended = await db.transaction().execute(async (trx) => {
    const n = await revokeUserSessions(trx, user.id)
    await writeAudit(trx, { actorId: user.id, action: 'sessions.revoked-all', targetType: 'user', targetId: user.id, detail: { sessions: n } })
    return n
  })
  await clearUserSession(event)
  return { ok: true, ended, message: `Signed out of ${ended} session${ended === 1 ? '' : 's'}.` }
})
