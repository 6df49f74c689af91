// Every state-changing API request (POST, PUT, PATCH, DELETE under /api) passes
// here before its route: 403 unless it comes from this site (Origin or
// Sec-Fetch-Site), 403 when a JSON route is sent a body that is not JSON, and
// 413 as soon as a JSON body passes 1 MB. The rules are in server/utils/request-guard.ts.
import type { H3Event } from 'h3'
import { LtiRefusal, refusalPage } from '~~/server/lib/lti/html'
import { LTI_FORM_MAX_BYTES, STATE_CHANGING, crossSiteProblem, declaresBody, isFormContentType, isJsonContentType, isUploadRoute, ltiFormRoute, readLimitedBody } from '~~/server/utils/request-guard'

export default defineEventHandler(async (event: H3Event) => {
  const method = event.method.toUpperCase()
  if (!STATE_CHANGING.has(method) || !event.path.startsWith('/api/')) return
  const headers = event.node.req.headers
  const ltiForm = ltiFormRoute(method, event.path)

  const problem = crossSiteProblem({
    origin: headers.origin,
    secFetchSite: typeof headers['sec-fetch-site'] === 'string' ? headers['sec-fetch-site'] : undefined,
    host: headers.host,
    hasCookie: !!headers.cookie,
    // the shared config: useRuntimeConfig(event) copies the whole config and re-reads the
    // environment for every request (about 2 ms per POST, measured), and the site URL is fixed at start
    siteUrl: String(useRuntimeConfig().public.siteUrl || ''),
  })
  if (problem && ltiForm !== 'platform') throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: problem.message, data: { code: problem.code } })

  if (isUploadRoute(method, event.path) || !declaresBody(event.node.req)) return
  // an LTI form (anything else sent there gets the JSON rules, and the route finds no form fields in it)
  if (ltiForm && isFormContentType(headers['content-type'])) {
    try {
      ;(event as unknown as { _requestBody: unknown })._requestBody = await readLimitedBody(event, LTI_FORM_MAX_BYTES)
    }
    catch (error) {
      // a browser posted this form: the refusal is a page, like every other LTI refusal
      const e = error as { statusCode?: number, message?: string, data?: { code?: string } }
      return refusalPage(event, new LtiRefusal(e.statusCode ?? 400, e.data?.code ?? 'body-unreadable', e.statusCode === 413 ? 'The form is larger than 64 KB.' : (e.message ?? 'The form could not be read.')))
    }
    return
  }
  if (!isJsonContentType(headers['content-type'])) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'Send the request body as JSON (Content-Type: application/json).', data: { code: 'json-required', fields: [{ path: '(body)', message: 'The body must be JSON.' }] } })
  }
  // Read (and count) the body here, once; readRawBody in the route then gets this buffer.
  const body = await readLimitedBody(event)
  ;(event as unknown as { _requestBody: unknown })._requestBody = body
})
