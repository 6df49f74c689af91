// The tutor's choice on the deep-linking page (an HTML form, so the answer can post on to
// the platform): the quiz goes back to the course as a resource link with a line item
// (Deep Linking 2.0 §4.5), and the course's cohort is assigned the quiz.
import { deepLinkForm, launchParam } from '#shared/schemas/lti'
import { CLAIM, DEEP_LINKING_REQUEST } from '~~/server/lib/lti/claims'
import { deepLinkingResponse } from '~~/server/lib/lti/deep-linking'
import { ownLaunch, readForm } from '~~/server/lib/lti/flow'
import { LtiRefusal, autoPostPage, refusalPage } from '~~/server/lib/lti/html'
import { assertManagesQuiz, quizForStaff } from '~~/server/lib/quiz/access'
import { computeResults } from '~~/server/lib/quiz/results'

export default defineEventHandler(async (event): Promise<string | void> => {
  const user = await requireRole(event, 'tutor', 'lecturer')
  const { id } = paramsAs(event, launchParam)
  const db = await useDb()
  try {
    const parsed = deepLinkForm.safeParse(await readForm(event))
    if (!parsed.success) throw new LtiRefusal(400, 'invalid-input', 'Choose a quiz to add to the course.', 'quizId')
    const launch = await ownLaunch(db, id, user.id)
    if (!launch || launch.message_type !== DEEP_LINKING_REQUEST) throw new LtiRefusal(404, 'not-found', 'That launch was not found, or it is more than an hour old: start again from your course.', 'launch')
    const quiz = await quizForStaff(db, user, parsed.data.quizId)
    assertManagesQuiz(user, quiz)
    const { columns } = await computeResults(db, quiz, new Date(), [])
    const maxScore = columns.reduce((sum, c) => sum + c.possible, 0)
    if (!columns.length || maxScore <= 0) throw new LtiRefusal(409, 'quiz-empty', 'This quiz has no items yet: add items before adding it to a course.', 'quizId')
    const platform = await db.selectFrom('lti_platforms').selectAll().where('id', '=', launch.platform_id).executeTakeFirstOrThrow()
    if (platform.disabled) throw new LtiRefusal(403, 'platform-disabled', 'This learning platform is not active in Cyclodial.')
    const context = launch.claims[CLAIM.context] as { id?: string } | undefined
    const course = context?.id
      ? await db.selectFrom('lti_contexts').select(['cohort_id', 'title']).where('platform_id', '=', platform.id)
          .where('deployment_id', '=', launch.claims[CLAIM.deploymentId] as string).where('context_id', '=', context.id).executeTakeFirst()
      : undefined
    if (course?.cohort_id) {
      const assigned = await db.selectFrom('quiz_cohorts').select('quiz_id').where('quiz_id', '=', quiz.id).where('cohort_id', '=', course.cohort_id).executeTakeFirst()
      if (!assigned) {
        await db.transaction().execute(async (trx) => {
          await trx.insertInto('quiz_cohorts').values({ quiz_id: quiz.id, cohort_id: course.cohort_id!, created_at: nowIso() }).execute()
          await writeAudit(trx, { actorId: user.id, action: 'lti.quiz-linked', targetType: 'quiz', targetId: quiz.id, detail: { title: quiz.title, cohortId: course.cohort_id, course: course.title } })
        })
      }
    }
    const { returnUrl, jwt } = await deepLinkingResponse(db, platform, launch.claims, { id: quiz.id, title: quiz.title, instructions: quiz.instructions ?? '', maxScore }, siteOrigin())
    return autoPostPage(event, returnUrl, { JWT: jwt }, `Adding “${quiz.title}” to your course`)
  }
  catch (error) {
    if (error instanceof LtiRefusal) return refusalPage(event, error)
    const e = error as { statusCode?: number, message?: string, data?: { code?: string } }
    if (e.statusCode && e.statusCode < 500) return refusalPage(event, new LtiRefusal(e.statusCode, e.data?.code ?? 'refused', e.message ?? 'Refused.'))
    throw error
  }
})
