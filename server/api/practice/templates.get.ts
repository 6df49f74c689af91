// GET /api/practice/templates (signed in): `{ items: [{ id, title, difficulties }] }` —
// base ids such as `so-palsy-right`; the title names the condition
import type { PracticeTemplateItem } from '#shared/types/practice'
import { practiceTemplateList } from '~~/server/lib/practice/templates'

// The case templates a learner may choose from. Titles name the condition: the
// learner asked to see the list (a case started with "any" stays unnamed).
export default defineEventHandler(async (event): Promise<{ items: PracticeTemplateItem[] }> => {
  await requireSignedIn(event)
  return { items: practiceTemplateList() }
})
