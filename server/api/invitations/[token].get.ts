// GET /api/invitations/:token (anyone): what the invitation offers (e-mail, role,
// cohort, the name given by whoever invited); `410` when used or expired
import { ROLE_LABELS } from '#shared/auth/roles'
import { invitationGone } from '~~/server/lib/roster/invitations'
import type { InvitationInfo } from '#shared/types/roster'

// Public: what an invitation link offers, so the page can show it before sign-up.
export default defineEventHandler(async (event): Promise<InvitationInfo> => {
  const token = getRouterParam(event, 'token') ?? ''
  const db = await useDb()
  const invitation = await db.selectFrom('invitations')
    .leftJoin('cohorts', 'cohorts.id', 'invitations.cohort_id')
    .select(['invitations.email', 'invitations.name', 'invitations.role', 'invitations.expires_at', 'invitations.used_at', 'cohorts.name as cohortName'])
    .where('invitations.token_hash', '=', hashToken(token))
    .executeTakeFirst()
  const state = invitation ? tokenState(invitation) : 'missing'
  if (!invitation || state !== 'usable') throw invitationGone(state)
  return {
    email: invitation.email,
    name: invitation.name,
    role: invitation.role,
    roleLabel: ROLE_LABELS[invitation.role],
    cohortName: invitation.cohortName,
    expiresAt: invitation.expires_at,
  }
})
