// POST /api/admin/invitations (admin): invite one person `{ email, role, cohortId?, name? }`
// (the name, when given, is offered on the acceptance form).
import { inviteBody } from '#shared/schemas/admin'
import { createInvitation } from '~~/server/lib/roster/invitations'
import type { InvitationSent } from '#shared/types/admin'

export default defineEventHandler(async (event): Promise<InvitationSent> => {
  const admin = await requireRole(event, 'admin')
  const body = await readBodyAs(event, inviteBody)
  const db = await useDb()

  const existing = await db.selectFrom('users').select('id').where('email', '=', body.email).executeTakeFirst()
  if (existing) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'Someone with that e-mail already has an account.', data: { code: 'account-exists', fields: [{ path: 'email', message: 'Already has an account.' }] } })
  }
  if (body.cohortId) {
    const cohort = await db.selectFrom('cohorts').select('id').where('id', '=', body.cohortId).executeTakeFirst()
    if (!cohort) badRequest([{ path: 'cohortId', message: 'Unknown cohort.' }])
  }
  const result = await createInvitation(event, { email: body.email, name: body.name ?? null, role: body.role, cohortId: body.cohortId ?? null, invitedBy: admin.id })
  setResponseStatus(event, 201)
  return {
    id: result.id,
    email: body.email,
    mailSent: result.mailSent,
    message: result.mailSent
      ? `Invitation sent to ${body.email}.`
      : `Invitation saved for ${body.email}; the e-mail could not be sent yet and will be retried.`,
  }
})
