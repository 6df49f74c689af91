// Changing a person (PATCH /api/admin/users/:id): name, role, disabled flag and cohorts.
// An administrator never locks themself out; a student keeps one cohort; every change
// is audited field by field, and a new role or a disabled account ends their sessions,
// all in one transaction.
import type { Kysely } from 'kysely'
import type { z } from 'zod'
import { createError } from 'h3'
import type { SessionUserData } from '#shared/auth/roles'
import type { userPatchBody } from '#shared/schemas/admin'
import type { Database, User } from '~~/db/schema'
import { writeAudit } from '~~/server/utils/audit'
import { nowIso } from '~~/server/utils/clock'
import { revokeUserSessions } from '~~/server/utils/sessions'
import { badRequest } from '~~/server/utils/validate'

export type UserPatch = z.output<typeof userPatchBody>

/** Applies a validated change to a person; 400/409 name the field. */
export async function updateUser(db: Kysely<Database>, admin: SessionUserData, user: User, body: UserPatch): Promise<void> {
  const id = user.id
  if (id === admin.id && (body.disabled === true || (body.role && body.role !== 'admin'))) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'You cannot disable or demote your own account; ask another administrator.', data: { code: 'self-lockout', fields: [{ path: body.disabled ? 'disabled' : 'role', message: 'Not allowed on your own account.' }] } })
  }
  const role = body.role ?? user.role
  if (body.cohortIds) {
    if (role === 'student' && body.cohortIds.length > 1) {
      badRequest([{ path: 'cohortIds', message: 'A student belongs to one cohort at most.' }])
    }
    if (body.cohortIds.length) {
      const found = await db.selectFrom('cohorts').select('id').where('id', 'in', body.cohortIds).execute()
      const missing = body.cohortIds.filter(c => !found.some(f => f.id === c))
      if (missing.length) badRequest([{ path: 'cohortIds', message: `Unknown cohort id(s): ${missing.join(', ')}.` }])
    }
  }
  if (role === 'student' && !body.cohortIds) {
    // A student keeps one cohort: demoting a tutor who teaches several needs a choice.
    const current = await db.selectFrom('cohort_members').select('cohort_id').where('user_id', '=', id).execute()
    if (current.length > 1) badRequest([{ path: 'cohortIds', message: 'Choose the one cohort this student belongs to.' }])
  }

  const now = nowIso()
  await db.transaction().execute(async (trx) => {
    const changes: Record<string, unknown> = {}
    const set: { name?: string, role?: typeof user.role, disabled?: 0 | 1, updated_at: string } = { updated_at: now }
    if (body.name !== undefined && body.name !== user.name) {
      set.name = body.name
      changes.name = { from: user.name, to: body.name }
    }
    if (body.role !== undefined && body.role !== user.role) {
      set.role = body.role
      changes.role = { from: user.role, to: body.role }
    }
    if (body.disabled !== undefined && (body.disabled ? 1 : 0) !== user.disabled) {
      set.disabled = body.disabled ? 1 : 0
      changes.disabled = { from: user.disabled === 1, to: body.disabled }
    }
    await trx.updateTable('users').set(set).where('id', '=', id).execute()
    if (body.cohortIds) {
      const before = await trx.selectFrom('cohort_members').select('cohort_id').where('user_id', '=', id).execute()
      await trx.deleteFrom('cohort_members').where('user_id', '=', id).execute()
      for (const cohortId of body.cohortIds) {
        await trx.insertInto('cohort_members').values({ cohort_id: cohortId, user_id: id, created_at: now }).execute()
      }
      changes.cohorts = { from: before.map(b => b.cohort_id), to: body.cohortIds }
    }
    // A new role or a disabled account ends every session the person has open.
    if (changes.role || (changes.disabled && set.disabled === 1)) await revokeUserSessions(trx, id, now)
    for (const [field, change] of Object.entries(changes)) {
      await writeAudit(trx, { actorId: admin.id, action: `user.${field === 'cohorts' ? 'cohorts-changed' : `${field}-changed`}`, targetType: 'user', targetId: id, detail: change as Record<string, unknown> })
    }
  })
}
