import { gradeLog } from '~~/server/lib/lti/grades'

// Every score sent (or waiting) to a learning platform, newest first.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  return { items: await gradeLog(await useDb(), {}) }
})
