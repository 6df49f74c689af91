// The second half of a launch, in the browser that started the login: its state cookie
// must be here (the platform's cross-site POST could not carry it). Then the account,
// the course and the resource link, and the person is signed in.
import { accountFor, courseFor, joinCourseCohort, resourceLinkFor, type LaunchClaims } from '~~/server/lib/lti/accounts'
import { CLAIM, DEEP_LINKING_REQUEST } from '~~/server/lib/lti/claims'
import { nextPath } from '~~/server/lib/lti/flow'
import { LtiRefusal, refusalPage } from '~~/server/lib/lti/html'
import { STATE_COOKIE_PREFIX } from '~~/server/lib/lti/launch'

export default defineEventHandler(async (event): Promise<string | void> => {
  const db = await useDb()
  try {
    const id = getQuery(event).launch
    if (typeof id !== 'string' || !/^[A-Za-z0-9_-]{20,64}$/.test(id)) throw new LtiRefusal(400, 'unknown-launch', 'This launch link is not valid.', 'launch')
    const row = await db.selectFrom('lti_launches').selectAll().where('id', '=', id).executeTakeFirst()
    if (!row || row.finished_at || row.expires_at < new Date().toISOString()) throw new LtiRefusal(400, 'unknown-launch', 'This launch was already finished or took too long. Open the link in your course again.', 'launch')
    const cookie = `${STATE_COOKIE_PREFIX}${row.state}`
    if (getCookie(event, cookie) !== '1') throw new LtiRefusal(403, 'other-browser', 'This launch was started in another browser (the login state is missing). Open the link in your course again.', 'launch')
    deleteCookie(event, cookie, { path: '/api/lti' })
    const claimed = await db.updateTable('lti_launches').set({ finished_at: new Date().toISOString() }).where('id', '=', id).where('finished_at', 'is', null).executeTakeFirst()
    if (Number(claimed.numUpdatedRows) !== 1) throw new LtiRefusal(400, 'unknown-launch', 'This launch was already finished.', 'launch')
    const platform = await db.selectFrom('lti_platforms').selectAll().where('id', '=', row.platform_id).executeTakeFirstOrThrow()
    const claims = JSON.parse(row.claims_json) as LaunchClaims
    const deploymentId = claims[CLAIM.deploymentId] as string
    // only instructors choose content; refused before any account is made
    if (row.message_type === DEEP_LINKING_REQUEST && claims['cyclodial:role'] !== 'tutor') {
      throw new LtiRefusal(403, 'not-an-instructor', 'Only a course\'s instructors choose what Cyclodial adds to it.')
    }
    const user = await accountFor(db, platform, claims, hashPassword)
    if (row.message_type === DEEP_LINKING_REQUEST && user.role === 'student') {
      throw new LtiRefusal(403, 'not-an-instructor', 'Only a course\'s instructors choose what Cyclodial adds to it.')
    }
    const course = await courseFor(db, platform, deploymentId, claims)
    await joinCourseCohort(db, user, course)
    const link = row.message_type === DEEP_LINKING_REQUEST ? null : await resourceLinkFor(db, platform, deploymentId, course, claims)
    await db.updateTable('lti_launches').set({ user_id: user.id }).where('id', '=', id).execute()
    await startSession(event, user)
    await db.updateTable('users').set({ last_login_at: nowIso() }).where('id', '=', user.id).execute()
    return sendRedirect(event, nextPath(id, { messageType: row.message_type, role: user.role, courseLinked: course ? course.cohort_id !== null : null, quizId: link?.quizId ?? null }), 302)
  }
  catch (error) {
    if (error instanceof LtiRefusal) return refusalPage(event, error)
    throw error
  }
})
