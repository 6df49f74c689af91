// Response shapes of the fundus routes, shared by the routes and the pages.
import type { Point } from '../engine/fundus/geometry'
import type { NormalRange } from '../engine/fundus/normals'
import type { FundusPresentation } from '../engine/fundus/picture'
import type { FundusComparison, FundusEyeMarks, FundusGradeResult } from '../engine/fundus/result'
import type { Eye, PerEye } from '../engine/types'

export interface FundusAttemptSummary {
  id: number
  submittedAt: string
  marks: Partial<PerEye<FundusEyeMarks>>
  result: FundusGradeResult
}

export interface CaseFundusView {
  caseId: number
  presentation: FundusPresentation
  attempts: FundusAttemptSummary[]
  /** Whether a double Maddox rod record has been submitted on the case. */
  dmrRecorded: boolean
  /** Subjective against objective; only once both measurements exist. */
  comparison: FundusComparison | null
}

export interface CaseFundusAttemptReply {
  attemptId: number
  result: FundusGradeResult
  dmrRecorded: boolean
  comparison: FundusComparison | null
}

export interface FundusPhotoView {
  id: number
  title: string
  eye: Eye
  width: number
  height: number
  /** Image route; only signed-in people allowed to see the photograph can fetch it. */
  imageUrl: string
  marked: boolean
  /** Staff who manage it see the reference marks; learners never do. */
  reference: { disc: Point, fovea: Point, angle: number } | null
  notes: string | null
  ownerName: string | null
  mine: boolean
  canManage: boolean
  cohorts: { id: number, name: string }[]
  createdAt: string
}

export interface FundusPhotoList {
  items: FundusPhotoView[]
  /** Cohorts the caller may share a new photograph with (staff only). */
  shareable: { id: number, name: string }[]
  /** Normal ranges shown beside the library. */
  normalRanges: PerEye<NormalRange>
}

export interface PhotoFundusAttemptReply {
  attemptId: number
  result: FundusGradeResult
  notes: string | null
}

/** GET /api/fundus/photos/:id — the photograph and the caller's attempts on it. */
export interface FundusPhotoReply { photo: FundusPhotoView, attempts: FundusAttemptSummary[], normalRanges: PerEye<NormalRange> }

/** DELETE /api/fundus/photos/:id. */
export interface FundusPhotoDeleted { deleted: number }
