// Edits a learning platform, or disables it (launches and grade return stop; nothing is deleted).
import { idParam } from '#shared/schemas/common'
import { platformPatchBody } from '#shared/schemas/lti'
import { platformView } from '~~/server/lib/lti/platforms'
import type { PlatformView } from '#shared/types/lti'

export default defineEventHandler(async (event): Promise<PlatformView> => {
  const admin = await requireRole(event, 'admin')
  const { id } = paramsAs(event, idParam)
  const body = await readBodyAs(event, platformPatchBody)
  const db = await useDb()
  const before = await db.selectFrom('lti_platforms').selectAll().where('id', '=', id).executeTakeFirst()
  if (!before) notFound('That learning platform')
  const issuer = body.issuer ?? before.issuer
  const clientId = body.clientId ?? before.client_id
  const clash = await db.selectFrom('lti_platforms').select('id').where('issuer', '=', issuer).where('client_id', '=', clientId).where('id', '!=', id).executeTakeFirst()
  if (clash) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'Another platform has this issuer and client id.', data: { code: 'platform-exists', fields: [{ path: 'clientId', message: 'Already registered with this issuer.' }] } })
  }
  const changes = {
    ...(body.name !== undefined ? { name: body.name } : {}),
    ...(body.issuer !== undefined ? { issuer: body.issuer } : {}),
    ...(body.clientId !== undefined ? { client_id: body.clientId } : {}),
    ...(body.deploymentIds !== undefined ? { deployment_ids: JSON.stringify([...new Set(body.deploymentIds)]) } : {}),
    ...(body.authUrl !== undefined ? { auth_url: body.authUrl } : {}),
    ...(body.tokenUrl !== undefined ? { token_url: body.tokenUrl } : {}),
    ...(body.jwksUrl !== undefined ? { jwks_url: body.jwksUrl } : {}),
    ...(body.disabled !== undefined ? { disabled: (body.disabled ? 1 : 0) as 0 | 1 } : {}),
  }
  const row = await db.transaction().execute(async (trx) => {
    const after = await trx.updateTable('lti_platforms').set({ ...changes, updated_at: nowIso() }).where('id', '=', id).returningAll().executeTakeFirstOrThrow()
    await writeAudit(trx, { actorId: admin.id, action: 'lti.platform-changed', targetType: 'lti-platform', targetId: id, detail: { name: after.name, changed: Object.keys(changes) } })
    return after
  })
  return platformView(row)
})
