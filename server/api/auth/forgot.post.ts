import { forgotBody } from '#shared/schemas/auth'

// Always the same answer, whether or not the e-mail has an account.
const ANSWER = { ok: true, message: 'If that e-mail belongs to an active account, a reset link is on its way. It works once, within an hour.' }

export default defineEventHandler(async (event) => {
  const { email } = await readBodyAs(event, forgotBody)
  const db = await useDb()
  const user = await db.selectFrom('users').select(['id', 'name', 'email', 'disabled']).where('email', '=', email).executeTakeFirst()
  if (!user || user.disabled) return ANSWER

  const { token, hash } = newToken()
  const now = nowIso()
  await db.insertInto('password_resets').values({
    user_id: user.id,
    token_hash: hash,
    expires_at: addMinutes(now, RESET_TTL_MINUTES),
    used_at: null,
    created_at: now,
  }).execute()
  await writeAudit(db, { actorId: null, action: 'password-reset.requested', targetType: 'user', targetId: user.id })

  const link = `${siteOrigin(event)}/reset/${token}`
  await sendMail({
    to: user.email,
    subject: 'Reset your Cyclodial password',
    text: `Hello ${user.name},\n\nSomeone (we hope you) asked to reset your Cyclodial password. Open this link within an hour to choose a new one:\n\n${link}\n\nThe link works once. If you did not ask, ignore this message and your password stays as it is.\n`,
  })
  return ANSWER
})
