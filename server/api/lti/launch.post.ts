// The platform posts the id_token here (form_post). Every check runs; a refusal is a
// page and a 4xx. A verified launch goes on to /api/lti/finish in the same browser.
import { LtiRefusal, refusalPage } from '~~/server/lib/lti/html'
import { readForm } from '~~/server/lib/lti/flow'
import { storeLaunch, verifyLaunch } from '~~/server/lib/lti/launch'

export default defineEventHandler(async (event): Promise<string | void> => {
  const db = await useDb()
  try {
    const form = await readForm(event)
    const launch = await verifyLaunch(db, form)
    const id = await storeLaunch(db, launch)
    return sendRedirect(event, `/api/lti/finish?launch=${id}`, 303)
  }
  catch (error) {
    if (error instanceof LtiRefusal) return refusalPage(event, error)
    throw error
  }
})
