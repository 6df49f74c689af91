// Slip patterns, per learner, in one pass: each attempt keeps its distinct slips
// as one short text key (attempts.slip_set), so "who needs help" groups the
// attempts by cohort, learner and key on one covering index — a few thousand
// groups at 200,000 attempts — instead of counting distinct attempts over the
// slips three times and the attempts once. Frozen in time: imports no app code.
//
// The key: the attempt's distinct slips written `code` or `code:EYE`, sorted
// (plain string order) and joined by single spaces; '' for a clean attempt.
// shared/review/slipSet.ts writes the same for new attempts (recordAttempt).
import type { Kysely } from 'kysely'

const CHUNK = 5000

function keyOf(slips: { code: string, eye: string | null }[]): string {
  return [...new Set(slips.map(s => (s.eye ? `${s.code}:${s.eye}` : s.code)))].sort().join(' ')
}

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('attempts').addColumn('slip_set', 'text', c => c.notNull().defaultTo('')).execute()

  // backfill from attempt_slips, a range of attempt ids at a time so memory stays flat
  const { top } = await db.selectFrom('attempts').select(eb => eb.fn.max('id').as('top')).executeTakeFirstOrThrow() as { top: number | null }
  for (let lo = 0; top !== null && lo < top; lo += CHUNK) {
    const rows = await db.selectFrom('attempt_slips').select(['attempt_id', 'code', 'eye'])
      .where('attempt_id', '>', lo).where('attempt_id', '<=', lo + CHUNK).execute() as { attempt_id: number, code: string, eye: string | null }[]
    const slipsOf = new Map<number, { code: string, eye: string | null }[]>()
    for (const r of rows) {
      const list = slipsOf.get(r.attempt_id) ?? []
      list.push(r)
      slipsOf.set(r.attempt_id, list)
    }
    // few distinct keys: one UPDATE per key and chunk
    const idsOf = new Map<string, number[]>()
    for (const [id, slips] of slipsOf) {
      const key = keyOf(slips)
      const ids = idsOf.get(key) ?? []
      ids.push(id)
      idsOf.set(key, ids)
    }
    for (const [key, ids] of idsOf) await db.updateTable('attempts').set({ slip_set: key }).where('id', 'in', ids).execute()
  }

  // cohort first (the scope), then learner and key in GROUP BY order, then 0004's filter
  // columns so the index alone answers. It also serves 0004's per-learner attempt totals
  // (same leading columns), so attempts_rv_learner goes: one index fewer to write.
  await db.schema.createIndex('attempts_rv_slip_set').on('attempts')
    .columns(['cohort_id', 'learner_id', 'slip_set', 'kind', 'quiz_id', 'submitted_at', 'template_id', 'condition']).execute()
  await db.schema.dropIndex('attempts_rv_learner').execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.createIndex('attempts_rv_learner').on('attempts')
    .columns(['cohort_id', 'learner_id', 'kind', 'quiz_id', 'submitted_at', 'template_id', 'condition']).execute()
  await db.schema.dropIndex('attempts_rv_slip_set').execute()
  await db.schema.alterTable('attempts').dropColumn('slip_set').execute()
}
