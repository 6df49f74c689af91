import { z } from 'zod'
import { CASEBOOK_ROLES, caseOut, engineTemplateList, seesEveryCasebook, templateOut } from '~~/server/utils/quiz/casebook'
import { DEFAULT_QUIZ_WEIGHTS } from '~~/server/utils/quiz/items'
import { DEFAULT_GRADE_TOLERANCE } from '~~/server/utils/engine/grader'

const query = z.object({ archived: z.enum(['0', '1'], { error: 'Archived must be 0 or 1.' }).default('0') })

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...CASEBOOK_ROLES)
  const { archived } = queryAs(event, query)
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
  const [t, c] = await Promise.all([
    templates.orderBy('casebook_templates.title').execute(),
    cases.orderBy('casebook_cases.title').execute(),
  ])
  return {
    engine: engineTemplateList(),
    templates: t.map(templateOut),
    cases: c.map(caseOut),
    defaults: { tolerance: DEFAULT_GRADE_TOLERANCE, weights: DEFAULT_QUIZ_WEIGHTS },
  }
})
