// Rotates the tool's signing key: the new key signs from now on; the older ones stay in
// the published key set (platforms cache it) until they are retired (docs/lti.md, "Keys").
import { rotateToolKey, toolJwks } from '~~/server/lib/lti/keys'
import type { KeyRotated } from '#shared/types/lti'

export default defineEventHandler(async (event): Promise<KeyRotated> => {
  const admin = await requireRole(event, 'admin')
  const db = await useDb()
  const kid = await rotateToolKey(db)
  await writeAudit(db, { actorId: admin.id, action: 'lti.key-rotated', targetType: 'lti-key', targetId: kid })
  return { kid, published: (await toolJwks(db)).keys.map(k => k.kid) }
})
