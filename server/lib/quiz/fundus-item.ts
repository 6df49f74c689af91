// A fundus item's pictures and grading. A generated source's picture is the fundus
// of the student's stored quiz case (fundusForCase, versioned like practice); a
// photograph's is the tutor's image, graded against the reference marks copied
// into the item when it was added. The browser gets the picture only.
import type { Kysely } from 'kysely'
import type { FundusEyeMarks, FundusGradeResult } from '#shared/engine/fundus/result'
import type { FundusPresentation } from '#shared/engine/fundus/picture'
import type { Point } from '#shared/engine/fundus/geometry'
import type { Eye, PerEye } from '#shared/engine/types'
import type { FundusItemDraft } from '#shared/schemas/quiz'
import type { FundusItemImage, StudentFundusFeedback } from '#shared/types/quiz'
import type { CaseRow, Database, FundusAttemptRow } from '~~/db/schema'
import { regenerateCase } from '~~/server/lib/practice/cases'
import { compareWithDmr } from '~~/server/lib/fundus/compare'
import type { FundusTruth } from '~~/server/lib/fundus/generate'
import { FUNDUS_VERSION, fundusForCase } from '~~/server/lib/fundus/generate'
import type { FundusReference } from '~~/server/lib/fundus/grade'
import { ddUnitFromMarks, gradeFundus } from '~~/server/lib/fundus/grade'
import { toFundusPresentation } from '~~/server/lib/fundus/presentation'
import type { Case } from '~~/server/lib/engine/types'
import type { FundusItemConfig } from './items'
import { fundusItemEyes } from './items'
import type { OverrideRow } from '~~/server/lib/data/mark-overrides'
import { applyOverrides, feedbackMarks, fundusMarksOf } from './marks'

export interface FundusItemPictures {
  eyes: Eye[]
  presentation: FundusPresentation | null
  photo: { imageUrl: string, width: number, height: number, eye: Eye } | null
  /** Server only: what the marks are graded against. */
  references: Partial<PerEye<FundusReference>>
  approximate: boolean
  fundusVersion: number | null
  case: Case | null
  truth: FundusTruth | null
}

export const photoImageUrl = (id: number): string => `/api/fundus/photos/${id}/image`

/** The route that renders one eye of a student's generated fundus item to pixels. */
export const itemPictureUrl = (quizId: number, itemId: number, eye: Eye): string => `/api/quizzes/${quizId}/items/${itemId}/pictures/${eye}`

/**
 * What a student's browser gets of a generated item's pictures during a sitting:
 * image routes and sizes (disc diameters, the units the marks are in), never the
 * disc and fovea coordinates or the look key. Null for a photograph item.
 */
export function studentItemImages(quizId: number, itemId: number, p: FundusItemPictures): Partial<Record<Eye, FundusItemImage>> | null {
  if (!p.presentation) return null
  return Object.fromEntries(p.eyes.map((e) => {
    const { frame } = p.presentation!.eyes[e]
    return [e, { imageUrl: itemPictureUrl(quizId, itemId, e), width: frame.width, height: frame.height, eye: e }]
  }))
}

/** The pictures of an item for one student: `caseRow` is their stored quiz case (null for a photograph). */
export function fundusItemPictures(config: FundusItemConfig, caseRow: CaseRow | null, version: number = FUNDUS_VERSION): FundusItemPictures {
  const src = config.source
  if (src.type === 'photo') {
    return {
      eyes: [src.eye],
      presentation: null,
      photo: { imageUrl: photoImageUrl(src.id), width: src.width, height: src.height, eye: src.eye },
      references: { [src.eye]: { eye: src.eye, disc: src.disc, fovea: src.fovea, ddUnit: ddUnitFromMarks(src.disc, src.fovea) } },
      approximate: true,
      fundusVersion: null,
      case: null,
      truth: null,
    }
  }
  if (!caseRow) throw new Error('A generated fundus item needs the student\'s case.')
  return fundusPicturesOfCase(config, regenerateCase(caseRow), version)
}

/** The pictures of a generated case (stored or, for a tutor's look ahead, derived). */
export function fundusPicturesOfCase(config: FundusItemConfig, c: Case, version: number = FUNDUS_VERSION): FundusItemPictures {
  const truth = fundusForCase(c, version)
  const ref = (eye: Eye): FundusReference => ({ eye, disc: truth.eyes[eye].picture.disc, fovea: truth.eyes[eye].picture.fovea, ddUnit: 1 })
  return {
    eyes: fundusItemEyes(config),
    presentation: toFundusPresentation(truth),
    photo: null,
    references: { RE: ref('RE'), LE: ref('LE') },
    approximate: false,
    fundusVersion: truth.fundusVersion,
    case: c,
    truth,
  }
}

/** The reference points per eye, for drawing beside the feedback. */
export const referencePoints = (p: FundusItemPictures): Partial<Record<Eye, { disc: Point, fovea: Point }>> =>
  Object.fromEntries(p.eyes.map(e => [e, { disc: p.references[e]!.disc, fovea: p.references[e]!.fovea }]))

export function gradeFundusItem(config: FundusItemConfig, pictures: FundusItemPictures, marks: Partial<PerEye<FundusEyeMarks>>): FundusGradeResult {
  const references = Object.fromEntries(pictures.eyes.map(e => [e, pictures.references[e]!]))
  return gradeFundus({ references, marks, approximate: pictures.approximate, tolerance: config.tolerance })
}

/** A stored fundus attempt's feedback: the grading as first given, the item's weighted marks with overrides. */
export function fundusFeedbackOf(attempt: Pick<FundusAttemptRow, 'id' | 'result_json'>, config: FundusItemConfig, pictures: FundusItemPictures, overrides: OverrideRow[], audience: 'student' | 'staff' = 'student'): StudentFundusFeedback {
  const result = JSON.parse(attempt.result_json) as FundusGradeResult
  const marks = applyOverrides(fundusMarksOf(result, config.weights), overrides.filter(o => o.attempt_id === attempt.id))
  return {
    attemptId: attempt.id,
    result,
    ...feedbackMarks(marks, audience),
    comparison: pictures.case && pictures.truth ? compareWithDmr(pictures.case, pictures.truth) : null,
  }
}

export async function fundusDraftOf(db: Kysely<Database>, itemId: number, studentId: number): Promise<(FundusItemDraft & { savedAt: string }) | null> {
  const row = await db.selectFrom('quiz_fundus_drafts').select(['draft_json', 'saved_at']).where('quiz_item_id', '=', itemId).where('student_id', '=', studentId).executeTakeFirst()
  return row ? { ...(JSON.parse(row.draft_json) as FundusItemDraft), savedAt: row.saved_at } : null
}
