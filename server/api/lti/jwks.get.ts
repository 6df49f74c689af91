// The tool's public keys (RFC 7517 §5): platforms verify deep-linking responses and
// client assertions with them.
import { toolJwks } from '~~/server/lib/lti/keys'
import type { ToolJwks } from '#shared/types/lti'

export default defineEventHandler(async (event): Promise<ToolJwks> => {
  setResponseHeader(event, 'Cache-Control', 'public, max-age=300')
  return toolJwks(await useDb())
})
