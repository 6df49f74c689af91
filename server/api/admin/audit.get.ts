// GET /api/admin/audit (admin): the audit log, newest first: `{ items: [{ id, action,
// target, detail, actorName, createdAt, words: { action, target, changes: [line] } }],
// total, page, pageSize }` — `words` is the row in plain words for the page; a quiz
// change keeps the values before under `detail.previous`
import { pageQuery } from '#shared/schemas/common'
import { countRows } from '~~/server/lib/data/paging'
import { auditActionWords, auditChangeWords, auditTargetWords } from '#shared/audit/words'
import type { AuditPage } from '#shared/types/admin'

export default defineEventHandler(async (event): Promise<AuditPage> => {
  await requireRole(event, 'admin')
  const { page, pageSize } = queryAs(event, pageQuery)
  const db = await useDb()
  const total = await countRows(db.selectFrom('audit_log'))
  const rows = await db.selectFrom('audit_log').leftJoin('users', 'users.id', 'audit_log.actor_id')
    .select(['audit_log.id', 'audit_log.action', 'audit_log.target_type', 'audit_log.target_id', 'audit_log.detail', 'audit_log.created_at', 'users.name as actorName'])
    .orderBy('audit_log.id', 'desc').limit(pageSize).offset((page - 1) * pageSize).execute()

  // names for the ids the rows mention, so the page can say who and what in words
  const parsed = rows.map(r => ({ row: r, detail: r.detail ? JSON.parse(r.detail) as unknown : null }))
  const userIds = new Set<number>()
  const cohortIds = new Set<number>()
  const quizIds = new Set<number>()
  const num = (v: unknown) => (typeof v === 'number' ? v : typeof v === 'string' && /^\d+$/.test(v) ? Number(v) : null)
  for (const { row, detail } of parsed) {
    const target = num(row.target_id)
    if (target !== null && row.target_type === 'user') userIds.add(target)
    if (target !== null && row.target_type === 'cohort') cohortIds.add(target)
    if (target !== null && row.target_type === 'quiz') quizIds.add(target)
    if (detail && typeof detail === 'object') {
      const d = detail as Record<string, unknown>
      for (const k of ['cohortIds', 'previousCohortIds']) if (Array.isArray(d[k])) for (const c of d[k] as unknown[]) if (num(c) !== null) cohortIds.add(num(c)!)
      if ((row.action === 'user.cohorts-changed') && d.from && d.to) for (const c of [...(d.from as unknown[]), ...(d.to as unknown[])]) if (num(c) !== null) cohortIds.add(num(c)!)
      if (num(d.cohortId) !== null) cohortIds.add(num(d.cohortId)!)
      if (num(d.studentId) !== null) userIds.add(num(d.studentId)!)
      if (num(d.quizId) !== null) quizIds.add(num(d.quizId)!)
      if (row.action === 'quiz.duplicated' && num(d.from) !== null) quizIds.add(num(d.from)!)
    }
  }
  const lookup = async (table: 'users' | 'cohorts', ids: Set<number>) => ids.size
    ? new Map((await db.selectFrom(table).select(['id', 'name']).where('id', 'in', [...ids]).execute()).map(r => [r.id, r.name]))
    : new Map<number, string>()
  const [userNames, cohortNames, quizTitles] = await Promise.all([
    lookup('users', userIds),
    lookup('cohorts', cohortIds),
    quizIds.size ? db.selectFrom('quizzes').select(['id', 'title']).where('id', 'in', [...quizIds]).execute().then(r => new Map(r.map(q => [q.id, q.title]))) : new Map<number, string>(),
  ])
  const names = { user: (id: number) => userNames.get(id), cohort: (id: number) => cohortNames.get(id), quiz: (id: number) => quizTitles.get(id) }

  return {
    items: parsed.map(({ row: r, detail }) => ({
      id: r.id,
      action: r.action,
      target: r.target_type ? `${r.target_type} ${r.target_id ?? ''}`.trim() : null,
      detail,
      actorName: r.actorName ?? 'system',
      createdAt: r.created_at,
      // the same row in words, for the page (codes and JSON stay for anyone reading the API)
      words: {
        action: auditActionWords(r.action),
        target: auditTargetWords(r.target_type, r.target_id, names),
        changes: auditChangeWords(r.action, detail, names),
      },
    })),
    total,
    page,
    pageSize,
  }
})
