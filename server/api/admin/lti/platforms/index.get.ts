// Registered learning platforms, and the tool's configuration to copy into a platform.
import { platformView, toolConfiguration } from '~~/server/lib/lti/platforms'
import type { PlatformList } from '#shared/types/lti'

export default defineEventHandler(async (event): Promise<PlatformList> => {
  await requireRole(event, 'admin')
  const db = await useDb()
  const rows = await db.selectFrom('lti_platforms').selectAll().orderBy('name').execute()
  return { items: rows.map(platformView), tool: toolConfiguration(siteOrigin()) }
})
