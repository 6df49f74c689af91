// POST /api/roster/import (tutor, lecturer, admin): the same upload; every row valid →
// `201 { imported, mailed, message }` (invitations created in one transaction, then
// e-mailed); any problem → `400` with the report and nothing imported
import { ROSTER_ROLES } from '#shared/auth/roles'
import type { RosterImportResult } from '#shared/types/roster'
import { readRoster } from '~~/server/lib/roster/upload'
import type { InviteInput } from '~~/server/lib/roster/invitations'
import { insertInvitation, mailInvitation } from '~~/server/lib/roster/invitations'

// All-or-nothing: any row with a problem refuses the whole file (with the report);
// otherwise every invitation is created in one transaction, then each is e-mailed.
export default defineEventHandler(async (event): Promise<RosterImportResult> => {
  const user = await requireRole(event, ...ROSTER_ROLES)
  const report = await readRoster(event, user)
  if (!report.canImport) {
    throw createError({
      statusCode: 400,
      statusMessage: 'Bad Request',
      message: `Nothing was imported: ${report.invalid} of ${report.total} row${report.total === 1 ? ' has' : 's have'} problems. Fix them and upload the file again.`,
      data: { code: 'roster-invalid', report, fields: report.rows.filter(r => r.problems.length).map(r => ({ path: `line ${r.line}`, message: r.problems.join(' ') })) },
    })
  }
  const db = await useDb()
  const created = await db.transaction().execute(async (trx) => {
    const out: { input: InviteInput, token: string }[] = []
    for (const row of report.rows) {
      const input: InviteInput = { email: row.email, name: row.name || null, role: 'student', cohortId: row.cohort!.id, invitedBy: user.id }
      const { token } = await insertInvitation(trx, input)
      out.push({ input, token })
    }
    await writeAudit(trx, { actorId: user.id, action: 'roster.imported', targetType: 'roster', detail: { invitations: out.length, cohorts: [...new Set(report.rows.map(r => r.cohort!.name))] } })
    return out
  })
  let mailed = 0
  for (const c of created) {
    const { sent } = await mailInvitation(event, c.input, c.token)
    if (sent) mailed++
  }
  setResponseStatus(event, 201)
  return {
    imported: created.length,
    mailed,
    message: `${created.length} invitation${created.length === 1 ? '' : 's'} created${mailed < created.length ? `; ${created.length - mailed} e-mail${created.length - mailed === 1 ? '' : 's'} will be retried` : ' and e-mailed'}.`,
  }
})
