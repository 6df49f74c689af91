// Storing and listing fundus measurements. One function writes an attempt so that
// practice, photographs and (later) quiz items store the same shape.

import type { Point } from '#shared/engine/fundus/geometry'
import type { FundusEyeMarks, FundusGradeResult } from '#shared/engine/fundus/result'
import type { PerEye } from '#shared/engine/types'
import type { AttemptKind } from '~~/db/schema'

export interface FundusAttemptInput {
  learnerId: number
  cohortId: number | null
  kind: AttemptKind
  caseId?: number | null
  photoId?: number | null
  quizId?: number | null
  quizItemId?: number | null
  fundusVersion?: number | null
  marks: Partial<PerEye<FundusEyeMarks>>
  result: FundusGradeResult
}

export interface FundusAttemptView {
  id: number
  submittedAt: string
  marks: Partial<PerEye<FundusEyeMarks>>
  result: FundusGradeResult
}

export async function storeFundusAttempt(input: FundusAttemptInput): Promise<FundusAttemptView> {
  const db = await useDb()
  const submittedAt = nowIso()
  const row = await db.insertInto('fundus_attempts').values({
    learner_id: input.learnerId,
    cohort_id: input.cohortId,
    kind: input.kind,
    case_id: input.caseId ?? null,
    photo_id: input.photoId ?? null,
    quiz_id: input.quizId ?? null,
    quiz_item_id: input.quizItemId ?? null,
    fundus_version: input.fundusVersion ?? null,
    marks_json: JSON.stringify(input.marks),
    result_json: JSON.stringify(input.result),
    score: input.result.score,
    re_angle: input.result.eyes.RE?.measuredAngle ?? null,
    le_angle: input.result.eyes.LE?.measuredAngle ?? null,
    submitted_at: submittedAt,
  }).returning('id').executeTakeFirstOrThrow()
  return { id: row.id, submittedAt, marks: input.marks, result: input.result }
}

export async function listFundusAttempts(learnerId: number, where: { caseId?: number, photoId?: number }): Promise<FundusAttemptView[]> {
  const db = await useDb()
  let q = db.selectFrom('fundus_attempts').select(['id', 'submitted_at', 'marks_json', 'result_json'])
    .where('learner_id', '=', learnerId)
    .where('kind', '=', 'practice')
  if (where.caseId !== undefined) q = q.where('case_id', '=', where.caseId)
  if (where.photoId !== undefined) q = q.where('photo_id', '=', where.photoId)
  const rows = await q.orderBy('submitted_at', 'desc').orderBy('id', 'desc').limit(20).execute()
  return rows.map(r => ({ id: r.id, submittedAt: r.submitted_at, marks: JSON.parse(r.marks_json), result: JSON.parse(r.result_json) }))
}

/** 400 naming the field when a mark lies off the picture. */
export function assertMarksOnPicture(marks: Record<string, { disc: Point, fovea: Point }>, size: { width: number, height: number }, prefix: string): void {
  const problems: { path: string, message: string }[] = []
  for (const [eye, m] of Object.entries(marks)) {
    for (const which of ['disc', 'fovea'] as const) {
      const p = m[which]
      if (p.x < 0 || p.x > size.width) problems.push({ path: `${prefix}${eye ? `${eye}.` : ''}${which}.x`, message: `The ${which === 'disc' ? 'disc centre' : 'fovea'} mark is off the picture (x runs from 0 to ${size.width}).` })
      if (p.y < 0 || p.y > size.height) problems.push({ path: `${prefix}${eye ? `${eye}.` : ''}${which}.y`, message: `The ${which === 'disc' ? 'disc centre' : 'fovea'} mark is off the picture (y runs from 0 to ${size.height}).` })
    }
  }
  if (problems.length) badRequest(problems)
}
