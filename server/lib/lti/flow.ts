// The browser side of a launch: the login answer (redirect, or the new-window hand-off
// inside a frame), reading the posted form, and where a finished launch goes next.
import { getQuery, getRequestHeader, readRawBody, sendRedirect, setCookie, type H3Event } from 'h3'
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'
import { homeFor, type Role } from '#shared/auth/roles'
import { DEEP_LINKING_REQUEST } from './claims'
import { LtiRefusal, newWindowPage, refusalPage } from './html'
import { STATE_COOKIE_PREFIX, STATE_SECONDS, checkLogin, startLogin, type LoginParams } from './launch'

const LOGIN_FIELDS = ['iss', 'login_hint', 'target_link_uri', 'lti_message_hint', 'client_id', 'lti_deployment_id'] as const

/** The URL-encoded form the request guard read (at most 64 KB). */
export async function readForm(event: H3Event): Promise<Record<string, string>> {
  const raw = await readRawBody(event, 'utf8')
  const form: Record<string, string> = {}
  for (const [k, v] of new URLSearchParams(raw ?? '')) form[k] = v
  return form
}

export async function loginParams(event: H3Event): Promise<LoginParams> {
  const source: Record<string, unknown> = event.method === 'POST' ? await readForm(event) : getQuery(event)
  const params: LoginParams = {}
  for (const f of LOGIN_FIELDS) if (typeof source[f] === 'string') params[f] = source[f] as string
  return params
}

export async function answerLogin(event: H3Event, db: Kysely<Database>, siteOrigin: string): Promise<string | void> {
  try {
    const params = await loginParams(event)
    const { platform, target } = await checkLogin(db, params, siteOrigin)
    if (getRequestHeader(event, 'sec-fetch-dest') === 'iframe') {
      const again = new URL(`${siteOrigin}/api/lti/login`)
      for (const [k, v] of Object.entries(params)) again.searchParams.set(k, v)
      const origins = [...new Set([new URL(platform.issuer).origin, new URL(platform.auth_url).origin])]
      return newWindowPage(event, again.href, origins)
    }
    const { state, url } = await startLogin(db, platform, params, target, `${siteOrigin}/api/lti/launch`)
    // binds the login to this browser; SameSite=Lax is enough: the finish step is a
    // top-level GET on this site (docs/lti.md, "Windows and cookies")
    setCookie(event, `${STATE_COOKIE_PREFIX}${state}`, '1', {
      httpOnly: true, sameSite: 'lax', secure: siteOrigin.startsWith('https:'), path: '/api/lti', maxAge: STATE_SECONDS,
    })
    return sendRedirect(event, url, 302)
  }
  catch (error) {
    if (error instanceof LtiRefusal) return refusalPage(event, error)
    throw error
  }
}

export interface LaunchNext { messageType: string, role: Role, courseLinked: boolean | null, quizId: number | null }

/** Where a finished launch sends the person. */
export function nextPath(launchId: string, n: LaunchNext): string {
  const staff = n.role === 'tutor' || n.role === 'lecturer'
  if (staff && n.courseLinked === false) return `/lti/course?launch=${launchId}`
  if (n.messageType === DEEP_LINKING_REQUEST) return `/lti/deep-link?launch=${launchId}`
  if (n.quizId) return n.role === 'student' ? `/student/quizzes/${n.quizId}` : `/quizzes/${n.quizId}`
  return homeFor(n.role)
}

/** A launch finished by this person within the last hour (for the course and deep-linking pages). */
export async function ownLaunch(db: Kysely<Database>, id: string, userId: number) {
  const row = await db.selectFrom('lti_launches').selectAll().where('id', '=', id).where('user_id', '=', userId).executeTakeFirst()
  if (!row || !row.finished_at || Date.parse(row.finished_at) < Date.now() - 3600_000) return null
  return { ...row, claims: JSON.parse(row.claims_json) as Record<string, unknown> }
}
