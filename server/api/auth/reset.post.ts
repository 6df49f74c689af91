// POST /api/auth/reset (anyone): `{ token, password }`; `410` when used or expired (of
// simultaneous uses exactly one succeeds); ends every session of that person; `400`
// naming `password` and saying why when the password is refused (see *Passwords*)
import { resetBody } from '#shared/schemas/auth'
import type { OkMessage } from '#shared/types/common'

function gone(state: string) {
  return createError({
    statusCode: 410,
    statusMessage: 'Gone',
    message: state === 'used' ? 'This reset link has already been used. Ask for a new one.' : 'This reset link has expired or is not valid. Ask for a new one.',
    data: { code: `reset-${state}` },
  })
}

export default defineEventHandler(async (event): Promise<OkMessage> => {
  const { token, password } = await readBodyAs(event, resetBody)
  const db = await useDb()
  const reset = await db.selectFrom('password_resets').selectAll().where('token_hash', '=', hashToken(token)).executeTakeFirst()
  const state = reset ? tokenState(reset) : 'missing'
  if (!reset || state !== 'usable') throw gone(state)
  const person = await db.selectFrom('users').select(['email', 'name']).where('id', '=', reset.user_id).executeTakeFirst()
  assertPasswordAcceptable(password, person ?? {})

  const passwordHash = await hashPassword(password)
  const now = nowIso()
  await db.transaction().execute(async (trx) => {
    // Consume the link with one conditional update: of several simultaneous
    // uses, exactly one changes the row; the others find it used.
    const consumed = await trx.updateTable('password_resets').set({ used_at: now })
      .where('id', '=', reset.id).where('used_at', 'is', null).where('expires_at', '>', now)
      .executeTakeFirst()
    if (Number(consumed.numUpdatedRows) !== 1) throw gone('used')
    await trx.updateTable('users').set({ password_hash: passwordHash, updated_at: now }).where('id', '=', reset.user_id).execute()
    // Every outstanding reset link for this person dies with this one.
    await trx.updateTable('password_resets').set({ used_at: now }).where('user_id', '=', reset.user_id).where('used_at', 'is', null).execute()
    // A new password ends every session the old one opened.
    await revokeUserSessions(trx, reset.user_id, now)
    await writeAudit(trx, { actorId: reset.user_id, action: 'password-reset.completed', targetType: 'user', targetId: reset.user_id })
  })
  return { ok: true, message: 'Your password has been changed. Sign in with the new one.' }
})
