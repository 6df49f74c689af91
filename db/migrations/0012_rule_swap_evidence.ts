// Rule-swap evidence per attempt (issue 11): attempts.rule_swap_eye names the eye
// whose direction was reversed while the OTHER eye, with a true torsion of 1° or
// more, was recorded with the right direction — the only kind of one-eye reversal
// that tells "uses one eye's rule on the other" from recording the image. NULL for
// every other attempt. recordAttempt writes it through ruleSwapEvidence
// (shared/engine/slips.ts); this migration backfills stored attempts with its own
// frozen copy of that rule, from the stored slips key, truth and recorded
// directions. Frozen in time: imports no app code.
//
// 0007's per-learner pass over the slip sets is left as it was; the evidence is
// counted in a second, small pass over a partial index that holds only the attempts
// with evidence (a few per cent), which also serves a rule swap's examples.
import type { Kysely } from 'kysely'
import { sql } from 'kysely'

const CHUNK = 5000
/** A true torsion of at least this has a direction (domain.md §5.2). */
const DIRECTION_FROM = 1

interface Row {
  id: number
  slip_set: string
  truth_json: string
  re_recorded_direction: string | null
  le_recorded_direction: string | null
}

function evidenceOf(r: Row): string | null {
  const reversed = new Set(r.slip_set.split(' ').filter(t => t.startsWith('direction-reversed:')).map(t => t.slice('direction-reversed:'.length)))
  if (reversed.size !== 1) return null
  const eye = [...reversed][0]
  if (eye !== 'RE' && eye !== 'LE') return null
  const other = eye === 'RE' ? 'LE' : 'RE'
  let torsion: unknown
  try {
    torsion = (JSON.parse(r.truth_json) as { torsion?: Record<string, unknown> } | null)?.torsion?.[other]
  }
  catch {
    return null
  }
  if (typeof torsion !== 'number' || Math.abs(torsion) < DIRECTION_FROM) return null
  const recorded = other === 'RE' ? r.re_recorded_direction : r.le_recorded_direction
  return recorded === (torsion > 0 ? 'excyclo' : 'incyclo') ? eye : null
}

export async function up(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable('attempts').addColumn('rule_swap_eye', 'varchar(2)').execute()

  // only attempts with a reversed direction can be evidence; a range of ids at a time
  const { top } = await db.selectFrom('attempts').select(eb => eb.fn.max('id').as('top')).executeTakeFirstOrThrow() as { top: number | null }
  for (let lo = 0; top !== null && lo < top; lo += CHUNK) {
    const rows = await db.selectFrom('attempts')
      .select(['id', 'slip_set', 'truth_json', 're_recorded_direction', 'le_recorded_direction'])
      .where('id', '>', lo).where('id', '<=', lo + CHUNK)
      .where('slip_set', 'like', '%direction-reversed:%')
      .execute() as Row[]
    const idsOf: Record<string, number[]> = { RE: [], LE: [] }
    for (const r of rows) {
      const eye = evidenceOf(r)
      if (eye) idsOf[eye]!.push(r.id)
    }
    for (const [eye, ids] of Object.entries(idsOf)) {
      if (ids.length) await db.updateTable('attempts').set({ rule_swap_eye: eye }).where('id', 'in', ids).execute()
    }
  }

  // the per-learner evidence counts and a swap's examples: only the telling attempts
  // (partial), by cohort, learner and eye, covering the review filters, so both walk a few rows
  await db.schema.createIndex('attempts_rv_rule_swap').on('attempts')
    .columns(['cohort_id', 'learner_id', 'rule_swap_eye', 'submitted_at', 'kind', 'quiz_id', 'template_id', 'condition'])
    .where(sql.ref('rule_swap_eye'), 'is not', null).execute()
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.dropIndex('attempts_rv_rule_swap').execute()
  await db.schema.alterTable('attempts').dropColumn('rule_swap_eye').execute()
}
