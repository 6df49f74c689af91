import type { H3Event } from 'h3'
import type { Transaction } from 'kysely'
import type { Database } from '~~/db/schema'
import type { Role } from '#shared/auth/roles'
import { invitationText } from '~~/server/lib/mail/invitation-text'

export interface InviteInput { email: string, name?: string | null, role: Role, cohortId: number | null, invitedBy: number | null }

/**
 * Creates an invitation record (the link's token is stored hashed) and e-mails
 * the link. The record is committed before the mail is tried, so a mail
 * failure never loses it; the mail job is retried.
 */
export async function createInvitation(event: H3Event, input: InviteInput): Promise<{ id: number, link: string, mailSent: boolean }> {
  const db = await useDb()
  const { id, token } = await db.transaction().execute(trx => insertInvitation(trx, input))
  const { link, sent } = await mailInvitation(event, input, token)
  return { id, link, mailSent: sent }
}

/**
 * The database half of createInvitation, for callers that create several
 * invitations in one transaction (a roster import is all-or-nothing) and mail
 * them with mailInvitation once it has committed.
 */
export async function insertInvitation(trx: Transaction<Database>, input: InviteInput): Promise<{ id: number, token: string }> {
  const { token, hash } = newToken()
  const now = nowIso()
  const row = await trx.insertInto('invitations').values({
    email: input.email,
    name: input.name ?? null,
    role: input.role,
    cohort_id: input.cohortId,
    token_hash: hash,
    invited_by: input.invitedBy,
    expires_at: addMinutes(now, INVITATION_TTL_MINUTES),
    used_at: null,
    created_at: now,
  }).returning('id').executeTakeFirstOrThrow()
  await writeAudit(trx, {
    actorId: input.invitedBy,
    action: 'invitation.created',
    targetType: 'invitation',
    targetId: row.id,
    detail: { email: input.email, role: input.role, cohortId: input.cohortId },
  })
  return { id: row.id, token }
}

/** The mail half of createInvitation: never inside a transaction. */
export async function mailInvitation(event: H3Event, input: InviteInput, token: string): Promise<{ link: string, sent: boolean }> {
  const db = await useDb()
  const link = `${siteOrigin(event)}/invite/${token}`
  const cohort = input.cohortId
    ? await db.selectFrom('cohorts').select('name').where('id', '=', input.cohortId).executeTakeFirst()
    : undefined
  const { sent } = await sendMail({
    to: input.email,
    subject: 'You are invited to Cyclodial',
    text: invitationText({ name: input.name, role: input.role, cohortName: cohort?.name, link }),
  })
  return { link, sent }
}

export function invitationGone(state: string) {
  return createError({
    statusCode: 410,
    statusMessage: 'Gone',
    message: state === 'used'
      ? 'This invitation has already been used. Sign in with the account it created.'
      : 'This invitation has expired or is not valid. Ask your administrator for a new one.',
    data: { code: `invitation-${state}` },
  })
}
