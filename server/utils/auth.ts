// Server-side role checks. The session cookie says which session this is; the
// sessions table (revoked? expired? idle?) and the user's role and disabled flag
// are re-read on every request in one indexed read (server/utils/sessions.ts),
// so a sign-out, a demotion or a disabled account takes effect at once.
import type { H3Event } from 'h3'
import type { Role, SessionUserData } from '#shared/auth/roles'

export async function currentUser(event: H3Event): Promise<SessionUserData | null> {
  const session = await resolveSession(event)
  return session ? { ...session.user } : null
}

/** 401 when nobody is signed in, 403 when the role is not one of `roles`. */
export async function requireRole(event: H3Event, ...roles: Role[]): Promise<SessionUserData> {
  const user = await currentUser(event)
  if (!user) {
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'Sign in to continue.', data: { code: 'unauthenticated' } })
  }
  if (roles.length && !roles.includes(user.role)) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'Your role cannot use this.', data: { code: 'forbidden' } })
  }
  return user
}

/** Any signed-in user. */
export function requireSignedIn(event: H3Event): Promise<SessionUserData> {
  return requireRole(event)
}

export function notFound(what = 'That item'): never {
  throw createError({ statusCode: 404, statusMessage: 'Not Found', message: `${what} was not found.`, data: { code: 'not-found' } })
}
