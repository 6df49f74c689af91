// A tutor launching from a new course links it to a cohort they teach, or to a new one
// (they then teach it). Learners launching from the course later join that cohort.
import { courseLinkBody, launchParam } from '#shared/schemas/lti'
import { CLAIM } from '~~/server/lib/lti/claims'
import { nextPath, ownLaunch } from '~~/server/lib/lti/flow'
import { assertCohortNameFree } from '~~/server/lib/roster/cohorts'
import type { CourseLinked } from '#shared/types/lti'

export default defineEventHandler(async (event): Promise<CourseLinked> => {
  const user = await requireRole(event, 'tutor', 'lecturer')
  const { id } = paramsAs(event, launchParam)
  const body = await readBodyAs(event, courseLinkBody)
  const db = await useDb()
  const launch = await ownLaunch(db, id, user.id)
  if (!launch) notFound('That launch')
  const context = launch.claims[CLAIM.context] as { id?: string } | undefined
  const course = context?.id
    ? await db.selectFrom('lti_contexts').selectAll().where('platform_id', '=', launch.platform_id)
        .where('deployment_id', '=', launch.claims[CLAIM.deploymentId] as string).where('context_id', '=', context.id).executeTakeFirst()
    : undefined
  if (!course) notFound('That course')
  if (course.cohort_id !== null) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This course is already linked to a cohort.', data: { code: 'course-linked' } })
  }
  let cohortId: number
  const now = nowIso()
  if ('cohortId' in body) {
    const teaches = await db.selectFrom('cohort_members').select('cohort_id').where('user_id', '=', user.id).where('cohort_id', '=', body.cohortId).executeTakeFirst()
    if (!teaches) badRequest([{ path: 'cohortId', message: 'Choose one of the cohorts you teach.' }])
    cohortId = body.cohortId
  }
  else {
    await assertCohortNameFree(body.newCohortName)
    cohortId = await db.transaction().execute(async (trx) => {
      const made = await trx.insertInto('cohorts').values({ name: body.newCohortName, created_at: now, updated_at: now }).returning('id').executeTakeFirstOrThrow()
      await trx.insertInto('cohort_members').values({ cohort_id: made.id, user_id: user.id, created_at: now }).execute()
      await writeAudit(trx, { actorId: user.id, action: 'cohort.created', targetType: 'cohort', targetId: made.id, detail: { name: body.newCohortName } })
      return made.id
    })
  }
  await db.transaction().execute(async (trx) => {
    await trx.updateTable('lti_contexts').set({ cohort_id: cohortId }).where('id', '=', course.id).execute()
    await writeAudit(trx, { actorId: user.id, action: 'lti.course-linked', targetType: 'cohort', targetId: cohortId, detail: { course: course.title } })
  })
  const link = await db.selectFrom('lti_resource_links').select('quiz_id')
    .where('platform_id', '=', launch.platform_id).where('context_id', '=', course.id)
    .where('resource_link_id', '=', String((launch.claims[CLAIM.resourceLink] as { id?: string } | undefined)?.id ?? '')).executeTakeFirst()
  return { cohortId, next: nextPath(id, { messageType: launch.message_type, role: user.role, courseLinked: true, quizId: link?.quiz_id ?? null }) }
})
