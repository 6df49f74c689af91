// Unknown /api paths answer a JSON 404 rather than the HTML app shell. Added to
// the router at start-up instead of as server/api/[...].ts, because a typed
// catch-all route would blur the response types of every dynamic API path.
export default defineNitroPlugin((nitro) => {
  nitro.router.add('/api/**', defineEventHandler(() => {
    throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'There is no API route at this address.', data: { code: 'no-route' } })
  }))
})
