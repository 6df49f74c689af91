// Registers a learning platform (LTI 1.3): issuer, client id, deployments and its URLs.
import { platformBody } from '#shared/schemas/lti'
import { platformView } from '~~/server/lib/lti/platforms'
import type { PlatformView } from '#shared/types/lti'

export default defineEventHandler(async (event): Promise<PlatformView> => {
  const admin = await requireRole(event, 'admin')
  const body = await readBodyAs(event, platformBody)
  const db = await useDb()
  const clash = await db.selectFrom('lti_platforms').select('id').where('issuer', '=', body.issuer).where('client_id', '=', body.clientId).executeTakeFirst()
  if (clash) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'A platform with this issuer and client id is already registered.', data: { code: 'platform-exists', fields: [{ path: 'clientId', message: 'Already registered with this issuer.' }] } })
  }
  const now = nowIso()
  const row = await db.transaction().execute(async (trx) => {
    const made = await trx.insertInto('lti_platforms').values({
      name: body.name, issuer: body.issuer, client_id: body.clientId, deployment_ids: JSON.stringify([...new Set(body.deploymentIds)]),
      auth_url: body.authUrl, token_url: body.tokenUrl, jwks_url: body.jwksUrl, disabled: 0, created_at: now, updated_at: now,
    }).returningAll().executeTakeFirstOrThrow()
    await writeAudit(trx, { actorId: admin.id, action: 'lti.platform-registered', targetType: 'lti-platform', targetId: made.id, detail: { name: body.name, issuer: body.issuer } })
    return made
  })
  setResponseStatus(event, 201)
  return platformView(row)
})
