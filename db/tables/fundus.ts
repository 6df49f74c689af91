// Table types: fundus photographs, who may see them, and disc–fovea attempts.
import type { Generated } from 'kysely'
import type { Timestamp } from './columns'
import type { AttemptKind } from './practice'

/** A tutor's fundus photograph: the file sits under the data folder, never in public/. */
export interface FundusPhotosTable {
  id: Generated<number>
  owner_id: number | null
  title: string
  eye: 'RE' | 'LE'
  notes: string | null
  /** File name inside the photo folder (random; never the uploaded name). */
  storage_name: string
  mime: 'image/jpeg' | 'image/png'
  byte_size: number
  width: number
  height: number
  /** Reference marks in image pixels (x right, y down); null until the tutor marks them. */
  disc_x: number | null
  disc_y: number | null
  fovea_x: number | null
  fovea_y: number | null
  reference_angle: number | null
  marked_at: Timestamp | null
  created_at: Timestamp
  updated_at: Timestamp
}

export interface FundusPhotoCohortsTable {
  photo_id: number
  cohort_id: number
}

/** A learner's disc–fovea measurement on a case's fundus or an uploaded photograph. */
export interface FundusAttemptsTable {
  id: Generated<number>
  learner_id: number
  cohort_id: number | null
  kind: AttemptKind
  case_id: number | null
  photo_id: number | null
  quiz_id: number | null
  quiz_item_id: number | null
  /** FUNDUS_VERSION that drew a case's fundus (null for photographs). */
  fundus_version: number | null
  marks_json: string
  result_json: string
  score: number
  re_angle: number | null
  le_angle: number | null
  submitted_at: Timestamp
}
