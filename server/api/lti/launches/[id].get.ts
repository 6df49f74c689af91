// What the course and deep-linking pages need about the caller's own launch: the course,
// whether it is linked to a cohort, and the cohorts the caller teaches.
import { launchParam } from '#shared/schemas/lti'
import { CLAIM } from '~~/server/lib/lti/claims'
import { ownLaunch } from '~~/server/lib/lti/flow'
import type { LaunchView } from '#shared/types/lti'

export default defineEventHandler(async (event): Promise<LaunchView> => {
  const user = await requireRole(event, 'tutor', 'lecturer')
  const { id } = paramsAs(event, launchParam)
  const db = await useDb()
  const launch = await ownLaunch(db, id, user.id)
  if (!launch) notFound('That launch')
  const platform = await db.selectFrom('lti_platforms').select('name').where('id', '=', launch.platform_id).executeTakeFirstOrThrow()
  const context = launch.claims[CLAIM.context] as { id?: string } | undefined
  const course = context?.id
    ? await db.selectFrom('lti_contexts').leftJoin('cohorts', 'cohorts.id', 'lti_contexts.cohort_id')
        .select(['lti_contexts.title', 'lti_contexts.cohort_id', 'cohorts.name as cohortName'])
        .where('lti_contexts.platform_id', '=', launch.platform_id).where('lti_contexts.context_id', '=', context.id)
        .where('lti_contexts.deployment_id', '=', launch.claims[CLAIM.deploymentId] as string).executeTakeFirst()
    : undefined
  const cohorts = await db.selectFrom('cohorts').innerJoin('cohort_members', 'cohort_members.cohort_id', 'cohorts.id')
    .select(['cohorts.id', 'cohorts.name']).where('cohort_members.user_id', '=', user.id).orderBy('cohorts.name').execute()
  return {
    messageType: launch.message_type,
    platformName: platform.name,
    course: course ? { title: course.title, cohortId: course.cohort_id, cohortName: course.cohortName } : null,
    cohorts,
  }
})
