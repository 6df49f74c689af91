import { toolJwks } from '~~/server/lib/lti/keys'

// The tool's public keys (RFC 7517 §5): platforms verify deep-linking responses and
// client assertions with them.
export default defineEventHandler(async (event) => {
  setResponseHeader(event, 'Cache-Control', 'public, max-age=300')
  return toolJwks(await useDb())
})
