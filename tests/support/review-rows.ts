// Direct inserts of attempts and their slips, for tests and the review
// benchmark that need many rows quickly. Columns mirror what recordAttempt
// stores (migration 0002); JSON fields default to small valid documents.
import type { Insertable, Kysely } from 'kysely'
import type { AttemptsTable, Database } from '../../db/schema'
import { ruleSwapEvidence } from '../../shared/engine/slips'
import type { Slip } from '../../shared/engine/slips'
import { slipSetOf } from '../../shared/review/slip-set'

export interface RowSlip { code: string, eye?: 'RE' | 'LE' }

export interface RowAttempt {
  learnerId: number
  cohortId: number | null
  kind?: 'practice' | 'quiz'
  quizId?: number | null
  templateId?: string
  condition?: string
  submittedAt: string
  slips: RowSlip[]
  reTrue?: string | null
  reRecorded?: string | null
  leTrue?: string | null
  leRecorded?: string | null
  reError?: number | null
  leError?: number | null
  /** The true signed torsion per eye (truth_json.torsion); with the recorded directions it decides rule_swap_eye (0012). */
  torsion?: { RE: number, LE: number }
  score?: number
  record?: string
  /** Extra columns (realistic JSON in the benchmark). */
  extra?: Partial<Insertable<AttemptsTable>>
}

let caseFor = new WeakMap<object, number>()

/** A case row to hang attempts on (attempts.case_id is a foreign key). */
export async function sharedCase(db: Kysely<Database>, ownerId: number): Promise<number> {
  const known = caseFor.get(db)
  if (known) return known
  const now = new Date().toISOString()
  const { id } = await db.insertInto('cases').values({
    owner_id: ownerId, purpose: 'practice', template_id: 'so-palsy-left-standard', seed: 'rows', generator_version: 1,
    condition: 'so-palsy', difficulty: 'standard', mode: 'learner-turns', created_at: now, updated_at: now,
  }).returning('id').executeTakeFirstOrThrow()
  caseFor.set(db, id)
  return id
}

export function resetSharedCase(): void {
  caseFor = new WeakMap()
}

export function attemptValues(a: RowAttempt, caseId: number): Insertable<AttemptsTable> {
  return {
    case_id: caseId,
    learner_id: a.learnerId,
    cohort_id: a.cohortId,
    kind: a.kind ?? 'practice',
    quiz_id: a.quizId ?? null,
    template_id: a.templateId ?? 'so-palsy-left-standard',
    condition: a.condition ?? 'so-palsy',
    difficulty: 'standard',
    mode: 'learner-turns',
    seed: 's',
    generator_version: 1,
    gaze: 'primary',
    distance: 'near',
    readings_json: '{"RE":90,"LE":85}',
    prisms_json: '[]',
    record_text: a.record ?? 'DMR, near, primary position: RE no torsion, LE 5° excyclotorsion.',
    parsed_json: '{}',
    marks_json: '[]',
    score: a.score ?? (a.slips.length ? 0.5 : 1),
    points_earned: 5,
    points_possible: 10,
    slips_json: JSON.stringify(a.slips),
    truth_json: a.torsion ? JSON.stringify({ torsion: a.torsion }) : '{}',
    re_true_direction: a.reTrue ?? null,
    re_recorded_direction: a.reRecorded ?? null,
    le_true_direction: a.leTrue ?? null,
    le_recorded_direction: a.leRecorded ?? null,
    re_amount_error: a.reError ?? null,
    le_amount_error: a.leError ?? null,
    submitted_at: a.submittedAt,
    // what recordAttempt stores beside the slip rows (migration 0007)
    slip_set: slipSetOf(a.slips),
    // what recordAttempt stores for the rule swap (migration 0012)
    rule_swap_eye: ruleSwapEvidence({ slips: a.slips as Slip[], torsion: a.torsion, recorded: { RE: a.reRecorded ?? null, LE: a.leRecorded ?? null } }),
    ...a.extra,
  }
}

/** Inserts attempts with their slip rows; returns the attempt ids in order. */
export async function insertAttempts(db: Kysely<Database>, rows: RowAttempt[], caseId?: number): Promise<number[]> {
  if (!rows.length) return []
  const cid = caseId ?? await sharedCase(db, rows[0]!.learnerId)
  const ids: number[] = []
  await db.transaction().execute(async (trx) => {
    for (let i = 0; i < rows.length; i += 200) {
      const chunk = rows.slice(i, i + 200)
      const inserted = await trx.insertInto('attempts').values(chunk.map(a => attemptValues(a, cid))).returning('id').execute()
      const slipRows = chunk.flatMap((a, j) => a.slips.map(s => ({
        attempt_id: inserted[j]!.id,
        learner_id: a.learnerId,
        cohort_id: a.cohortId,
        kind: a.kind ?? 'practice',
        quiz_id: a.quizId ?? null,
        template_id: a.templateId ?? 'so-palsy-left-standard',
        condition: a.condition ?? 'so-palsy',
        code: s.code,
        eye: s.eye ?? null,
        created_at: a.submittedAt,
      })))
      for (let k = 0; k < slipRows.length; k += 300) await trx.insertInto('attempt_slips').values(slipRows.slice(k, k + 300)).execute()
      ids.push(...inserted.map(r => r.id))
    }
  })
  return ids
}
