import { rotateToolKey, toolJwks } from '~~/server/lib/lti/keys'

// Rotates the tool's signing key: the new key signs from now on; the older ones stay in
// the published key set (platforms cache it) until they are retired (docs/lti.md, "Keys").
export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'admin')
  const db = await useDb()
  const kid = await rotateToolKey(db)
  await writeAudit(db, { actorId: admin.id, action: 'lti.key-rotated', targetType: 'lti-key', targetId: kid })
  return { kid, published: (await toolJwks(db)).keys.map(k => k.kid) }
})
