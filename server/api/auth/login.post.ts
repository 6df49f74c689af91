import { homeFor } from '#shared/auth/roles'
import { loginBody } from '#shared/schemas/auth'

const GENERIC = 'That e-mail and password do not match an active account.'

export default defineEventHandler(async (event) => {
  const { email, password } = await readBodyAs(event, loginBody)
  const ip = clientAddress(event)
  const db = await useDb()

  // Reserved before the password is checked, atomically (server/utils/rate-limit.ts).
  const throttle = await reserveLoginAttempt(db, email, ip)
  if (throttle.limited) {
    setResponseHeader(event, 'Retry-After', throttle.retryAfterSeconds)
    throw createError({
      statusCode: 429,
      statusMessage: 'Too Many Requests',
      message: `Too many failed sign-ins. Try again in ${Math.ceil(throttle.retryAfterSeconds / 60)} minute(s).`,
      data: { code: 'rate-limited', retryAfterSeconds: throttle.retryAfterSeconds },
    })
  }

  try {
    if (throttle.delayMs) await new Promise(r => setTimeout(r, throttle.delayMs))

    const user = await db.selectFrom('users').selectAll().where('email', '=', email).executeTakeFirst()
    // Verify against a real hash even for unknown e-mails so timing does not
    // reveal which addresses have accounts.
    const ok = user
      ? await verifyPassword(user.password_hash, password)
      : (await verifyPassword(await dummyHash(), password), false)

    if (!user || !ok || user.disabled) {
      // the reservation stays as the failure
      throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: GENERIC, data: { code: 'bad-credentials' } })
    }

    await clearLoginFailures(db, email, ip)
    await db.updateTable('users').set({ last_login_at: nowIso() }).where('id', '=', user.id).execute()
    if (passwordNeedsReHash(user.password_hash)) {
      await db.updateTable('users').set({ password_hash: await hashPassword(password) }).where('id', '=', user.id).execute()
    }
    const sessionUser = { id: user.id, email: user.email, name: user.name, role: user.role }
    await startSession(event, sessionUser)
    return { user: sessionUser, home: homeFor(user.role) }
  }
  finally {
    await settleLoginAttempt(db, throttle.attemptId)
  }
})

let dummy: Promise<string> | undefined
function dummyHash(): Promise<string> {
  dummy ??= hashPassword('not-a-real-password-for-timing-only')
  return dummy
}
