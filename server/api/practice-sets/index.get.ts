// GET /api/practice-sets (student (own)): practice sets sent to me: `{ items: [{ id,
// title, note, mode, sentAt, sender, cases: [{ id, number, attempted }], done }] }` —
// case ids only
import type { AssignedPracticeSet } from '#shared/types/review'

/** The practice sets a learner's tutors sent them, with their cases (ids only: nothing that names the answer). */
export default defineEventHandler(async (event): Promise<{ items: AssignedPracticeSet[] }> => {
  const user = await requireRole(event, 'student')
  const db = await useDb()
  const sets = await db.selectFrom('practice_set_learners')
    .innerJoin('practice_sets', 'practice_sets.id', 'practice_set_learners.set_id')
    .leftJoin('users', 'users.id', 'practice_sets.created_by')
    .select(['practice_sets.id', 'practice_sets.title', 'practice_sets.note', 'practice_sets.mode', 'practice_set_learners.sent_at', 'users.name as sender'])
    .where('practice_set_learners.learner_id', '=', user.id)
    .orderBy('practice_set_learners.sent_at', 'desc').orderBy('practice_sets.id', 'desc').limit(50).execute()
  const ids = sets.map(s => s.id)
  const cases = ids.length
    ? await db.selectFrom('cases')
        .select(eb => ['cases.id', 'cases.practice_set_id', eb.exists(eb.selectFrom('attempts').select('attempts.id').whereRef('attempts.case_id', '=', 'cases.id')).as('attempted')])
        .where('cases.owner_id', '=', user.id).where('cases.practice_set_id', 'in', ids).orderBy('cases.id').execute()
    : []
  return {
    items: sets.map((s) => {
      const mine = cases.filter(c => c.practice_set_id === s.id)
      return {
        id: s.id,
        title: s.title,
        note: s.note,
        mode: s.mode,
        sentAt: s.sent_at,
        sender: s.sender,
        cases: mine.map((c, i) => ({ id: c.id, number: i + 1, attempted: Boolean(c.attempted) })),
        done: mine.filter(c => c.attempted).length,
      }
    }),
  }
})
