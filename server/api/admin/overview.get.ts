// GET /api/admin/overview (admin): counts for the admin home
import type { AdminOverview } from '#shared/types/admin'

export default defineEventHandler(async (event): Promise<AdminOverview> => {
  await requireRole(event, 'admin')
  const db = await useDb()
  const roles = await db.selectFrom('users').select(['role', eb => eb.fn.countAll<number>().as('n')]).groupBy('role').execute()
  const { cohorts } = await db.selectFrom('cohorts').select(eb => eb.fn.countAll<number>().as('cohorts')).executeTakeFirstOrThrow()
  const { pending } = await db.selectFrom('invitations').select(eb => eb.fn.countAll<number>().as('pending'))
    .where('used_at', 'is', null).where('expires_at', '>', nowIso()).executeTakeFirstOrThrow()
  const { waiting } = await db.selectFrom('mail_jobs').select(eb => eb.fn.countAll<number>().as('waiting'))
    .where('status', '!=', 'sent').executeTakeFirstOrThrow()
  return {
    people: Object.fromEntries(roles.map(r => [r.role, Number(r.n)])) as Partial<Record<string, number>>,
    cohorts: Number(cohorts),
    pendingInvitations: Number(pending),
    mailWaiting: Number(waiting),
  }
})
