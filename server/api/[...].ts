// Any /api path with no handler is a JSON 404, never the HTML app shell.
export default defineEventHandler(() => {
  throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'There is no API route at this address.', data: { code: 'no-route' } })
})
