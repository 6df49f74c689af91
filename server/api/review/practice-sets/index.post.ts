// POST /api/review/practice-sets (tutor, lecturer): `{ learnerIds: [id] \| cohortId,
// focus /* a pattern code */, eye? /* required for left-right-rule-swapped */, size?
// (3–12, default 6), note? }` → `201 { id, title, learners, casesPerLearner }`; e-mails
// each learner; a learner or cohort outside the caller's is `404`
import { REVIEW_ROLES } from '#shared/auth/roles'
import { practiceSetBody } from '#shared/schemas/review'
import { createPracticeSet } from '~~/server/lib/review/practice-sets'
import { reviewScopeFor } from '~~/server/lib/review/scope'
import type { PracticeSetMade } from '#shared/types/review'

/** Send a targeted practice set to some learners or a whole cohort; each learner gets an e-mail. */
export default defineEventHandler(async (event): Promise<PracticeSetMade> => {
  const user = await requireRole(event, ...REVIEW_ROLES)
  const body = await readBodyAs(event, practiceSetBody)
  const db = await useDb()
  const scope = await reviewScopeFor(db, user, body.cohortId)

  let learners = db.selectFrom('users')
    .innerJoin('cohort_members', 'cohort_members.user_id', 'users.id')
    .select(['users.id', 'users.email', 'users.name', 'cohort_members.cohort_id'])
    .where('users.role', '=', 'student').where('users.disabled', '=', 0)
  if (scope.cohortIds) learners = learners.where('cohort_members.cohort_id', 'in', scope.cohortIds.length ? scope.cohortIds : [-1])
  if (body.learnerIds) learners = learners.where('users.id', 'in', body.learnerIds)
  const found = await learners.orderBy('users.id').execute()
  const unique = [...new Map(found.map(l => [l.id, l])).values()]
  if (body.learnerIds) {
    const missing = body.learnerIds.filter(id => !unique.some(l => l.id === id))
    // a learner outside the caller's cohorts is reported exactly like one that does not exist
    if (missing.length) notFound(`Learner ${missing.join(', ')}`)
  }
  if (!unique.length) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'That cohort has no active learners to send a set to.', data: { code: 'no-learners', fields: [{ path: 'cohortId', message: 'No active learners.' }] } })
  }
  const cohorts = [...new Set(unique.map(l => l.cohort_id))]
  const setId = await createPracticeSet(db, {
    createdBy: user.id,
    cohortId: body.cohortId ?? (cohorts.length === 1 ? cohorts[0]! : null),
    scope: body.cohortId ? 'cohort' : 'learner',
    focus: body.focus,
    eye: body.eye,
    size: body.size,
    note: body.note,
    learners: unique,
  }, nowIso())

  const set = await db.selectFrom('practice_sets').select(['title', 'size']).where('id', '=', setId).executeTakeFirstOrThrow()
  const origin = siteOrigin(event)
  // mail goes after the transaction (DEVELOPERS.md): a failed send is retried, never lost
  for (const l of unique) {
    const { jobId } = await sendMail({
      to: l.email,
      subject: `A practice set from ${user.name}: ${set.title}`,
      text: [
        `Hello ${l.name},`,
        '',
        `${user.name} has sent you a practice set in Cyclodial: “${set.title}” (${set.size} cases).`,
        ...(body.note ? ['', body.note] : []),
        '',
        `Open it from your practice page: ${origin}/practice`,
        '',
        'Cyclodial is a simulation for education; real assessment follows local protocols under licensed clinical supervision.',
      ].join('\n'),
    })
    await db.updateTable('practice_set_learners').set({ mail_job_id: jobId }).where('set_id', '=', setId).where('learner_id', '=', l.id).execute()
  }
  setResponseStatus(event, 201)
  return { id: setId, title: set.title, learners: unique.length, casesPerLearner: set.size }
})
