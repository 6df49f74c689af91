// Who may see a fundus photograph: lecturers and admins always; the person who
// uploaded it; and anyone (student or tutor) in a cohort it is shared with — by
// default the cohorts its tutor teaches. The image alone is also served to the
// people of a quiz that uses the photograph (quizGivesPhoto). Everyone else is told
// it does not exist.

import type { SessionUserData } from '#shared/auth/roles'
import type { Kysely } from 'kysely'
import { jsonNumber, jsonText } from '~~/db/dialect'
import type { Database, FundusPhotoRow } from '~~/db/schema'
import { feedbackReleased } from '../quiz/timing'

export const seesEveryFundusPhoto = (user: SessionUserData): boolean => user.role === 'lecturer' || user.role === 'admin'

/** May change or delete it: the uploader, a lecturer or an admin. */
export const managesFundusPhoto = (user: SessionUserData, photo: Pick<FundusPhotoRow, 'owner_id'>): boolean =>
  seesEveryFundusPhoto(user) || (user.role === 'tutor' && photo.owner_id === user.id)

/**
 * Photographs a student may not open, list or measure in the library just now: those
 * of a fundus item in a published, unarchived quiz assigned to their cohort whose
 * feedback is not open yet. Measuring one would return its reference angle — the
 * item's answer — during the sitting. They come back when the quiz's feedback opens.
 */
export async function photosHeldForQuiz(db: Kysely<Database>, user: SessionUserData, now: Date = new Date()): Promise<Set<number>> {
  if (user.role !== 'student') return new Set()
  const rows = await db.selectFrom('quiz_items as qi')
    .innerJoin('quizzes as q', 'q.id', 'qi.quiz_id')
    .select([jsonNumber(db, 'qi.config_json', '$.source.id').as('photoId'), 'q.released_at', 'q.hold_feedback', 'q.closes_at'])
    .where('qi.kind', '=', 'fundus')
    .where(jsonText(db, 'qi.config_json', '$.source.type'), '=', 'photo')
    .where('q.published_at', 'is not', null).where('q.archived_at', 'is', null)
    .where('q.id', 'in', eb => eb.selectFrom('quiz_cohorts as qc').innerJoin('cohort_members as m', 'm.cohort_id', 'qc.cohort_id').select('qc.quiz_id').where('m.user_id', '=', user.id))
    .execute()
  return new Set(rows.filter(r => !feedbackReleased(r, now)).map(r => Number(r.photoId)))
}

/**
 * The photograph if this person may see it in the fundus library (staff rules, or a
 * cohort it is shared with, and for a student not held for a quiz), else undefined.
 * Takes the db so quiz code can call it.
 */
export async function photoVisibleTo(db: Kysely<Database>, user: SessionUserData, id: number): Promise<FundusPhotoRow | undefined> {
  const photo = await db.selectFrom('fundus_photos').selectAll().where('id', '=', id).executeTakeFirst()
  if (!photo) return undefined
  if (seesEveryFundusPhoto(user) || photo.owner_id === user.id) return photo
  if ((await photosHeldForQuiz(db, user)).has(id)) return undefined
  const shared = await db.selectFrom('fundus_photo_cohorts as pc')
    .innerJoin('cohort_members as m', 'm.cohort_id', 'pc.cohort_id')
    .select('pc.photo_id')
    .where('pc.photo_id', '=', id)
    .where('m.user_id', '=', user.id)
    .executeTakeFirst()
  return shared ? photo : undefined
}

/** The photograph if this person may see it, otherwise a 404 (never a hint that it exists). */
export async function fundusPhotoFor(user: SessionUserData, id: number): Promise<FundusPhotoRow> {
  const photo = await photoVisibleTo(await useDb(), user, id)
  if (!photo) notFound('That fundus photograph')
  return photo
}

/** Quiz items whose source is this photograph (`config_json.source`, see server/utils/quiz/items.ts). */
export const photoItemsQuery = (db: Kysely<Database>, photoId: number) => db.selectFrom('quiz_items as qi')
  .where('qi.kind', '=', 'fundus')
  .where(jsonText(db, 'qi.config_json', '$.source.type'), '=', 'photo')
  .where(jsonNumber(db, 'qi.config_json', '$.source.id'), '=', photoId)

/**
 * Whether a quiz gives this person the photograph's pixels: a student of a cohort
 * assigned a published, unarchived quiz with an item on the photograph (during the
 * sitting and after); a tutor who owns such a quiz or teaches a cohort it is
 * assigned to. Only the image — the library page, its title and practice grading
 * stay with the sharing rule above, so a quiz never gives away the answer early.
 */
export async function quizGivesPhoto(db: Kysely<Database>, user: SessionUserData, photoId: number): Promise<boolean> {
  if (user.role !== 'student' && user.role !== 'tutor') return false
  let q = photoItemsQuery(db, photoId)
    .innerJoin('quizzes as q', 'q.id', 'qi.quiz_id')
    .select('qi.id')
  if (user.role === 'student') {
    q = q.where('q.published_at', 'is not', null).where('q.archived_at', 'is', null)
      .where('q.id', 'in', eb => eb.selectFrom('quiz_cohorts as qc').innerJoin('cohort_members as m', 'm.cohort_id', 'qc.cohort_id').select('qc.quiz_id').where('m.user_id', '=', user.id))
  }
  else {
    q = q.where(eb => eb.or([
      eb('q.owner_id', '=', user.id),
      eb('q.id', 'in', eb.selectFrom('quiz_cohorts as qc').innerJoin('cohort_members as m', 'm.cohort_id', 'qc.cohort_id').select('qc.quiz_id').where('m.user_id', '=', user.id)),
    ]))
  }
  return !!(await q.limit(1).executeTakeFirst())
}

/** The photograph for its image route: the library rule, or a quiz that uses it (quizGivesPhoto); else 404. */
export async function fundusPhotoImageFor(user: SessionUserData, id: number): Promise<FundusPhotoRow> {
  const db = await useDb()
  const photo = await photoVisibleTo(db, user, id)
  if (photo) return photo
  const row = await db.selectFrom('fundus_photos').selectAll().where('id', '=', id).executeTakeFirst()
  if (!row || !(await quizGivesPhoto(db, user, id))) notFound('That fundus photograph')
  return row
}

/** Cohort ids a person may share a photograph with: a tutor's own cohorts, or any for lecturers and admins. */
export async function shareableCohortIds(user: SessionUserData): Promise<number[]> {
  const db = await useDb()
  if (seesEveryFundusPhoto(user)) return (await db.selectFrom('cohorts').select('id').execute()).map(r => r.id)
  return cohortIdsOf(user.id)
}
