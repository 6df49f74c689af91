// Every score sent (or waiting) to a learning platform, newest first.
import { gradeLog } from '~~/server/lib/lti/grades'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  return { items: await gradeLog(await useDb(), {}) }
})
