// POST /api/invitations/:token/accept (anyone): `{ name, password }` → creates the
// account and signs in; the password rules of *Passwords* apply
import { homeFor } from '#shared/auth/roles'
import { acceptInvitationBody } from '#shared/schemas/auth'
import { invitationGone } from '~~/server/lib/roster/invitations'
import type { SignedInReply } from '#shared/types/admin'

export default defineEventHandler(async (event): Promise<SignedInReply> => {
  const token = getRouterParam(event, 'token') ?? ''
  const body = await readBodyAs(event, acceptInvitationBody)
  const db = await useDb()
  const invitation = await db.selectFrom('invitations').selectAll().where('token_hash', '=', hashToken(token)).executeTakeFirst()
  const state = invitation ? tokenState(invitation) : 'missing'
  if (!invitation || state !== 'usable') throw invitationGone(state)

  const existing = await db.selectFrom('users').select('id').where('email', '=', invitation.email).executeTakeFirst()
  if (existing) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'An account with this e-mail already exists. Sign in instead, or reset the password.', data: { code: 'account-exists' } })
  }

  assertPasswordAcceptable(body.password, { email: invitation.email, name: body.name })

  const passwordHash = await hashPassword(body.password)
  const now = nowIso()
  const user = await db.transaction().execute(async (trx) => {
    // Consume the link with one conditional update and check it changed a row:
    // of several simultaneous uses exactly one succeeds.
    const used = await trx.updateTable('invitations').set({ used_at: now })
      .where('id', '=', invitation.id).where('used_at', 'is', null).where('expires_at', '>', now).executeTakeFirst()
    if (Number(used.numUpdatedRows) !== 1) throw invitationGone('used')
    const created = await trx.insertInto('users').values({
      email: invitation.email,
      name: body.name,
      role: invitation.role,
      password_hash: passwordHash,
      disabled: 0,
      created_at: now,
      updated_at: now,
      last_login_at: now,
    }).returning(['id', 'email', 'name', 'role']).executeTakeFirstOrThrow()
    if (invitation.cohort_id) {
      await trx.insertInto('cohort_members').values({ cohort_id: invitation.cohort_id, user_id: created.id, created_at: now }).execute()
    }
    await writeAudit(trx, { actorId: created.id, action: 'invitation.accepted', targetType: 'user', targetId: created.id, detail: { invitationId: invitation.id } })
    return created
  })

  await startSession(event, user)
  return { user, home: homeFor(user.role) }
})
