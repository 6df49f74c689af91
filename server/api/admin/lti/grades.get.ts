// Every score sent (or waiting) to a learning platform, newest first.
import { gradeLog } from '~~/server/lib/lti/grades'
import type { AdminGradeLog } from '#shared/types/lti'

export default defineEventHandler(async (event): Promise<AdminGradeLog> => {
  await requireRole(event, 'admin')
  return { items: await gradeLog(await useDb(), {}) }
})
