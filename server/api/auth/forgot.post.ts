import { lockForTransaction } from '~~/db/dialect'
import { forgotBody } from '#shared/schemas/auth'

// Always the same answer, in the same time, whether or not the e-mail has an
// account: the look-up and the mail happen after the answer is sent.
const ANSWER = { ok: true, message: 'If that e-mail belongs to an active account, a reset link is on its way. It works once, within an hour.' }

/** At most this many reset e-mails per account, and per asking address, per hour (common practice). */
const RESET_MAILS_PER_ACCOUNT_PER_HOUR = 3
const RESET_MAILS_PER_ADDRESS_PER_HOUR = 10

async function sendResetLink(email: string, ip: string): Promise<void> {
  const db = await useDb()
  const user = await db.selectFrom('users').select(['id', 'name', 'email', 'disabled']).where('email', '=', email).executeTakeFirst()
  if (!user || user.disabled) return

  const now = nowIso()
  const hourAgo = new Date(Date.now() - 3_600_000).toISOString()
  const issued = await db.transaction().execute(async (trx) => {
    // Count-then-insert must not race on PostgreSQL: hold the address's and the
    // account's locks (always in this order) until the transaction ends.
    await lockForTransaction(trx, `reset ip ${ip}`)
    await lockForTransaction(trx, `reset user ${user.id}`)
    const [forAccount, forAddress] = await Promise.all([
      trx.selectFrom('password_resets').select(eb => eb.fn.countAll<number>().as('n'))
        .where('user_id', '=', user.id).where('created_at', '>', hourAgo).executeTakeFirstOrThrow(),
      trx.selectFrom('password_resets').select(eb => eb.fn.countAll<number>().as('n'))
        .where('requested_ip', '=', ip).where('created_at', '>', hourAgo).executeTakeFirstOrThrow(),
    ])
    if (Number(forAccount.n) >= RESET_MAILS_PER_ACCOUNT_PER_HOUR || Number(forAddress.n) >= RESET_MAILS_PER_ADDRESS_PER_HOUR) {
      await writeAudit(trx, { actorId: null, action: 'password-reset.limited', targetType: 'user', targetId: user.id })
      return null
    }
    const { token, hash } = newToken()
    await trx.insertInto('password_resets').values({
      user_id: user.id,
      token_hash: hash,
      expires_at: addMinutes(now, RESET_TTL_MINUTES),
      used_at: null,
      created_at: now,
      requested_ip: ip,
    }).execute()
    await writeAudit(trx, { actorId: null, action: 'password-reset.requested', targetType: 'user', targetId: user.id })
    return token
  })
  if (!issued) return

  const link = `${siteOrigin()}/reset/${issued}`
  await sendMail({
    to: user.email,
    subject: 'Reset your Cyclodial password',
    text: `Hello ${user.name},\n\nSomeone (we hope you) asked to reset your Cyclodial password. Open this link within an hour to choose a new one:\n\n${link}\n\nThe link works once. If you did not ask, ignore this message and your password stays as it is.\n`,
  })
}

export default defineEventHandler(async (event) => {
  const { email } = await readBodyAs(event, forgotBody)
  const ip = clientAddress(event)
  // Queued after answering; a failure is logged, never shown (it would tell).
  void new Promise<void>(resolve => setImmediate(resolve))
    .then(() => sendResetLink(email, ip))
    .catch((error) => {
      console.error(`[auth] reset request failed: ${error instanceof Error ? error.message : error}`)
    })
  return ANSWER
})
