// My practice attempts, newest first.
import { PRACTICE_ROLES } from '#shared/auth/roles'
import { practiceHistoryQuery } from '#shared/schemas/practice'
import type { PracticeHistory } from '#shared/types/practice'
import { getCaseTemplate } from '~~/server/lib/engine/templates'
import { baseTemplateId } from '~~/server/lib/practice/templates'

export default defineEventHandler(async (event): Promise<PracticeHistory> => {
  const user = await requireRole(event, ...PRACTICE_ROLES)
  const query = queryAs(event, practiceHistoryQuery)
  const db = await useDb()
  let base = db.selectFrom('attempts').where('learner_id', '=', user.id).where('kind', '=', 'practice')
  if (query.template) {
    const base_ = baseTemplateId(query.template)
    base = base.where('template_id', 'in', query.template === base_ ? [`${base_}-standard`, `${base_}-challenging`] : [query.template])
  }
  const { total } = await base.select(eb => eb.fn.countAll<number>().as('total')).executeTakeFirstOrThrow()
  const rows = await base
    .select(['id', 'case_id', 'submitted_at', 'template_id', 'truth_json', 'mode', 'score', 'slips_json'])
    .orderBy('submitted_at', 'desc').orderBy('id', 'desc')
    .limit(query.pageSize).offset((query.page - 1) * query.pageSize)
    .execute()
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
    total: Number(total),
    page: query.page,
    pageSize: query.pageSize,
  }
})
