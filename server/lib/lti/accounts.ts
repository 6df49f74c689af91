// People, courses and resource links from a finished launch: the account linked to the
// platform's person (issuer + subject), the course (context) linked to a cohort, and the
// resource link bound to a quiz with its line item (AGS 2.0 §3.1).
import { createHash, randomBytes } from 'node:crypto'
import type { Kysely } from 'kysely'
import type { Database, LtiPlatformRow } from '~~/db/schema'
import type { SessionUserData } from '#shared/auth/roles'
import { CLAIM, CUSTOM_QUIZ, type MappedRole } from './claims'
import { LtiRefusal } from './html'

export type LaunchClaims = Record<string, unknown> & { 'sub': string, 'cyclodial:role': MappedRole, 'cyclodial:target': string }

function text(value: unknown, max: number): string | null {
  if (typeof value !== 'string') return null
  // one line, no control characters (names are shown and exported)
  const clean = [...value].filter(ch => ch.charCodeAt(0) >= 0x20 && ch.charCodeAt(0) !== 0x7F).join('').trim()
  return clean ? clean.slice(0, max) : null
}

/** The person's name as the platform sends it (OpenID Connect Core 1.0 §5.1), or a neutral one. */
export function nameFrom(claims: Record<string, unknown>): string {
  return text(claims.name, 120)
    ?? ([text(claims.given_name, 60), text(claims.family_name, 60)].filter(Boolean).join(' ') || 'Learning platform user')
}

function emailFrom(claims: Record<string, unknown>): string | null {
  const email = text(claims.email, 254)?.toLowerCase()
  return email && /^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(email) ? email : null
}

/** An address that can never receive mail (RFC 2606 .invalid) for a person without a usable e-mail. */
function placeholderEmail(platformId: number, subject: string): string {
  return `lti-${platformId}-${createHash('sha256').update(subject).digest('hex').slice(0, 16)}@platform.invalid`
}

/**
 * The Cyclodial account linked to this platform's person, made on the first launch.
 * Never linked by e-mail to an existing account (a platform must not be able to take
 * over an account by naming its address); such a person gets their own account with a
 * placeholder address. The role is set when the account is made.
 */
export async function accountFor(db: Kysely<Database>, platform: LtiPlatformRow, claims: LaunchClaims, hash: (p: string) => Promise<string>): Promise<SessionUserData> {
  const linked = await db.selectFrom('lti_users').innerJoin('users', 'users.id', 'lti_users.user_id')
    .select(['users.id', 'users.email', 'users.name', 'users.role', 'users.disabled'])
    .where('lti_users.platform_id', '=', platform.id).where('lti_users.subject', '=', claims.sub).executeTakeFirst()
  if (linked) {
    if (linked.disabled) throw new LtiRefusal(403, 'account-disabled', 'Your Cyclodial account is disabled; ask your course\'s administrator.')
    return { id: linked.id, email: linked.email, name: linked.name, role: linked.role }
  }
  const now = new Date().toISOString()
  const name = nameFrom(claims)
  let email = emailFrom(claims)
  if (email && await db.selectFrom('users').select('id').where('email', '=', email).executeTakeFirst()) email = null
  email ??= placeholderEmail(platform.id, claims.sub)
  const role = claims['cyclodial:role']
  const passwordHash = await hash(randomBytes(32).toString('base64url')) // nobody knows it: these accounts sign in through the platform
  return db.transaction().execute(async (trx) => {
    const user = await trx.insertInto('users').values({
      email, name, role, password_hash: passwordHash, disabled: 0, created_at: now, updated_at: now, last_login_at: now,
    }).returning(['id']).executeTakeFirstOrThrow()
    await trx.insertInto('lti_users').values({ platform_id: platform.id, subject: claims.sub, user_id: user.id, created_at: now }).execute()
    await trx.insertInto('audit_log').values({
      actor_id: null, action: 'lti.account-created', target_type: 'user', target_id: String(user.id),
      detail: JSON.stringify({ platform: platform.name, role, name }), created_at: now,
    }).execute()
    return { id: user.id, email, name, role }
  })
}

export interface CourseRow { id: number, cohort_id: number | null, title: string | null }

/** The course the launch came from (LTI Core 1.3 §5.4.1), recorded on first sight; null without a context claim. */
export async function courseFor(db: Kysely<Database>, platform: LtiPlatformRow, deploymentId: string, claims: Record<string, unknown>): Promise<CourseRow | null> {
  const context = claims[CLAIM.context] as { id?: unknown, title?: unknown, label?: unknown } | undefined
  if (!context || typeof context.id !== 'string' || !context.id) return null
  const title = text(context.title, 255) ?? text(context.label, 255)
  const find = () => db.selectFrom('lti_contexts').select(['id', 'cohort_id', 'title'])
    .where('platform_id', '=', platform.id).where('deployment_id', '=', deploymentId).where('context_id', '=', context.id as string).executeTakeFirst()
  const found = await find()
  if (found) return found
  try {
    await db.insertInto('lti_contexts').values({ platform_id: platform.id, deployment_id: deploymentId, context_id: context.id, title, cohort_id: null, created_at: new Date().toISOString() }).execute()
  }
  catch { /* made by a launch at the same moment */ }
  return (await find())!
}

/** A learner launching from a linked course joins its cohort (when in no cohort yet). */
export async function joinCourseCohort(db: Kysely<Database>, user: SessionUserData, course: CourseRow | null): Promise<void> {
  if (!course?.cohort_id || user.role !== 'student') return
  const member = await db.selectFrom('cohort_members').select('cohort_id').where('user_id', '=', user.id).executeTakeFirst()
  if (member) return
  const now = new Date().toISOString()
  await db.transaction().execute(async (trx) => {
    await trx.insertInto('cohort_members').values({ cohort_id: course.cohort_id!, user_id: user.id, created_at: now }).execute()
    await trx.insertInto('audit_log').values({
      actor_id: user.id, action: 'lti.cohort-joined', target_type: 'cohort', target_id: String(course.cohort_id), detail: JSON.stringify({ course: course.title }), created_at: now,
    }).execute()
  })
}

/** The resource link (LTI Core 1.3 §5.3.5): recorded, with its line item (AGS 2.0 §3.1) and the quiz its custom parameter names. */
export async function resourceLinkFor(db: Kysely<Database>, platform: LtiPlatformRow, deploymentId: string, course: CourseRow | null, claims: Record<string, unknown>): Promise<{ id: number, quizId: number | null } | null> {
  const link = claims[CLAIM.resourceLink] as { id?: unknown } | undefined
  if (!link || typeof link.id !== 'string') return null
  const ags = claims[CLAIM.agsEndpoint] as { lineitem?: unknown, scope?: unknown } | undefined
  const lineItem = typeof ags?.lineitem === 'string' ? ags.lineitem : null
  const scopes = Array.isArray(ags?.scope) ? (ags.scope as unknown[]).filter(s => typeof s === 'string').join(' ') : null
  const custom = claims[CLAIM.custom] as Record<string, unknown> | undefined
  const quizText = custom && typeof custom[CUSTOM_QUIZ] === 'string' ? custom[CUSTOM_QUIZ] as string : null
  let quizId: number | null = null
  if (quizText && /^\d{1,9}$/.test(quizText)) {
    const quiz = await db.selectFrom('quizzes').select('id').where('id', '=', Number(quizText)).executeTakeFirst()
    quizId = quiz?.id ?? null
  }
  const now = new Date().toISOString()
  const existing = await db.selectFrom('lti_resource_links').select(['id', 'quiz_id'])
    .where('platform_id', '=', platform.id).where('deployment_id', '=', deploymentId).where('resource_link_id', '=', link.id).executeTakeFirst()
  if (existing) {
    await db.updateTable('lti_resource_links').set({
      line_item_url: lineItem ?? undefined, ags_scopes: scopes ?? undefined, quiz_id: existing.quiz_id ?? quizId, context_id: course?.id ?? undefined, updated_at: now,
    }).where('id', '=', existing.id).execute()
    return { id: existing.id, quizId: existing.quiz_id ?? quizId }
  }
  const row = await db.insertInto('lti_resource_links').values({
    platform_id: platform.id, deployment_id: deploymentId, resource_link_id: link.id, context_id: course?.id ?? null, quiz_id: quizId,
    line_item_url: lineItem, ags_scopes: scopes, created_at: now, updated_at: now,
  }).returning(['id']).executeTakeFirstOrThrow()
  return { id: row.id, quizId }
}
