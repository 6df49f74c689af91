// Signing out revokes this session on the server, not only the browser's cookie.
import type { OkReply } from '#shared/types/common'

export default defineEventHandler(async (event): Promise<OkReply> => {
  await endSession(event)
  return { ok: true }
})
