// GET /api/casebook (tutor, lecturer): `?archived=0\|1&page&pageSize` (page from 1;
// `pageSize` 1–100, default 50, the same page of templates and of exact cases, each in
// title order) → `{ engine: [case templates with published ranges and sources],
// templates, cases, defaults: { tolerance, weights }, page, pageSize, templatesTotal,
// casesTotal }` (a tutor sees their own entries, a lecturer everyone's)
import { listPaging } from '#shared/schemas/common'
import { CASEBOOK_ROLES } from '#shared/auth/roles'
import type { CasebookData } from '#shared/types/casebook'
import { z } from 'zod'
import { caseOut, engineTemplateList, seesEveryCasebook, templateOut } from '~~/server/lib/casebook/casebook'
import { DEFAULT_QUIZ_WEIGHTS } from '~~/server/lib/quiz/items'
import { DEFAULT_GRADE_TOLERANCE } from '~~/server/lib/engine/grader'

const query = z.object({ archived: z.enum(['0', '1'], { error: 'Archived must be 0 or 1.' }).default('0'), ...listPaging })

// Paged: `page` (from 1) and `pageSize` (default 50, at most 100) apply to the
// templates and to the exact cases alike, each in title order, with each list's total.
export default defineEventHandler(async (event): Promise<CasebookData> => {
  const user = await requireRole(event, ...CASEBOOK_ROLES)
  const { archived, page, pageSize } = queryAs(event, query)
  const db = await useDb()
  let templates = db.selectFrom('casebook_templates').leftJoin('users', 'users.id', 'casebook_templates.owner_id')
    .selectAll('casebook_templates').select('users.name as ownerName')
  let cases = db.selectFrom('casebook_cases').leftJoin('users', 'users.id', 'casebook_cases.owner_id')
    .selectAll('casebook_cases').select('users.name as ownerName')
  if (!seesEveryCasebook(user)) {
    templates = templates.where('casebook_templates.owner_id', '=', user.id)
    cases = cases.where('casebook_cases.owner_id', '=', user.id)
  }
  if (archived === '0') {
    templates = templates.where('casebook_templates.archived_at', 'is', null)
    cases = cases.where('casebook_cases.archived_at', 'is', null)
  }
  const offset = (page - 1) * pageSize
  const [t, c, templatesTotal, casesTotal] = await Promise.all([
    templates.orderBy('casebook_templates.title').orderBy('casebook_templates.id').limit(pageSize).offset(offset).execute(),
    cases.orderBy('casebook_cases.title').orderBy('casebook_cases.id').limit(pageSize).offset(offset).execute(),
    templates.clearSelect().select(eb => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow(),
    cases.clearSelect().select(eb => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow(),
  ])
  return {
    engine: engineTemplateList(),
    templates: t.map(templateOut),
    cases: c.map(caseOut),
    page,
    pageSize,
    templatesTotal: Number(templatesTotal.n),
    casesTotal: Number(casesTotal.n),
    defaults: { tolerance: DEFAULT_GRADE_TOLERANCE, weights: DEFAULT_QUIZ_WEIGHTS },
  }
})
