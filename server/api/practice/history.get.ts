// My practice attempts, newest first.
import { PRACTICE_ROLES } from '#shared/auth/roles'
import { practiceHistoryQuery } from '#shared/schemas/practice'
import type { PracticeHistory } from '#shared/types/practice'
import { getCaseTemplate } from '~~/server/lib/engine/templates'
import { baseTemplateId } from '~~/server/lib/practice/templates'
import { practiceHistoryPage } from '~~/server/lib/data/attempts'

export default defineEventHandler(async (event): Promise<PracticeHistory> => {
  const user = await requireRole(event, ...PRACTICE_ROLES)
  const query = queryAs(event, practiceHistoryQuery)
  const db = await useDb()
  // a base template id means both its difficulties
  const base = query.template ? baseTemplateId(query.template) : null
  const templateIds = !query.template ? null : query.template === base ? [`${base}-standard`, `${base}-challenging`] : [query.template]
  const { rows, total } = await practiceHistoryPage(db, user.id, templateIds, query)
  return {
    items: rows.map(r => ({
      attemptId: r.id,
      caseId: r.case_id,
      submittedAt: r.submitted_at,
      title: (r.template_id && getCaseTemplate(r.template_id)?.label) || JSON.parse(r.truth_json).label,
      mode: r.mode,
      score: r.score,
      slips: JSON.parse(r.slips_json),
    })),
    total,
    page: query.page,
    pageSize: query.pageSize,
  }
})
