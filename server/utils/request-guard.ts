// Rules for state-changing API requests, applied by server/middleware/request-guard.ts
// before any route reads its body: same-origin only (cross-site request forgery),
// a JSON content type on JSON routes, and a 1 MB body limit counted as the bytes
// arrive (chunked bodies included). Uploads are multipart and keep their own limits.
import type { IncomingMessage } from 'node:http'
import type { H3Event } from 'h3'

/** JSON bodies above this are refused with 413 (1 MiB). */
export const JSON_BODY_MAX_BYTES = 1024 * 1024

export const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

/** Routes that take a multipart upload (and check its size themselves). */
const UPLOAD_ROUTES: { method: string, path: RegExp }[] = [
  { method: 'POST', path: /^\/api\/fundus\/photos\/?$/ },
  { method: 'POST', path: /^\/api\/roster\/(?:preview|import)\/?$/ },
]

/**
 * LTI 1.3 form posts. `platform`: the learning platform's page posts these across
 * sites (OIDC login initiation and the id_token form_post, LTI Core 1.3 §4.1): no
 * Origin rule (the signed id_token, its nonce and the state cookie are the proof),
 * and they carry no session. `site`: a Cyclodial page's own HTML form (so its answer
 * may post on to the platform): the Origin rule holds. Both are URL-encoded forms of
 * at most 64 KB.
 */
const LTI_FORM_ROUTES: { kind: 'platform' | 'site', path: RegExp }[] = [
  { kind: 'platform', path: /^\/api\/lti\/(?:login|launch)\/?$/ },
  { kind: 'site', path: /^\/api\/lti\/launches\/[A-Za-z0-9_-]+\/deep-link\/?$/ },
]
export const LTI_FORM_MAX_BYTES = 64 * 1024

export function ltiFormRoute(method: string, path: string): 'platform' | 'site' | null {
  if (method !== 'POST') return null
  const bare = path.split('?')[0]!
  return LTI_FORM_ROUTES.find(r => r.path.test(bare))?.kind ?? null
}

export function isFormContentType(value: string | undefined): boolean {
  return (value ?? '').split(';')[0]!.trim().toLowerCase() === 'application/x-www-form-urlencoded'
}

export function isUploadRoute(method: string, path: string): boolean {
  const bare = path.split('?')[0]!
  return UPLOAD_ROUTES.some(r => r.method === method && r.path.test(bare))
}

function tooLarge(): never {
  throw createError({ statusCode: 413, statusMessage: 'Payload Too Large', message: `The request body is larger than ${JSON_BODY_MAX_BYTES / 1024 / 1024} MB.`, data: { code: 'body-too-large' } })
}

/** The origin a same-site browser would send: the configured site URL's, if any. */
export function configuredOrigin(siteUrl: string): string | null {
  if (!siteUrl) return null
  try {
    return new URL(siteUrl).origin
  }
  catch {
    return null
  }
}

export interface OriginFacts {
  origin: string | undefined
  secFetchSite: string | undefined
  host: string | undefined
  hasCookie: boolean
  siteUrl: string
}

/**
 * Why a state-changing request is refused as cross-site, or null when it may go on.
 * - An `Origin` header must equal the configured site origin (NUXT_PUBLIC_SITE_URL);
 *   without one configured, its host must equal the request's `Host`.
 * - `Sec-Fetch-Site` other than same-origin or none is refused (same-site
 *   subdomains included, which SameSite=Lax cookies do not stop).
 * - With neither header the caller is not a current browser (they send Origin on
 *   every POST/PUT/PATCH/DELETE): allowed only when it carries no cookie, so a
 *   script may sign in, but a cookie-authenticated request must name its Origin.
 */
export function crossSiteProblem(f: OriginFacts): { message: string, code: string } | null {
  const site = (f.secFetchSite ?? '').trim().toLowerCase()
  if (site && site !== 'same-origin' && site !== 'none') {
    return { message: 'Cross-site requests cannot change anything here: use Cyclodial from its own address.', code: 'cross-site' }
  }
  if (f.origin !== undefined) {
    const expected = configuredOrigin(f.siteUrl)
    let given: URL | null = null
    try {
      given = f.origin === 'null' ? null : new URL(f.origin)
    }
    catch { /* not a URL */ }
    const same = given !== null && (expected ? given.origin === expected : !!f.host && given.host === f.host.toLowerCase())
    if (!same) return { message: `Requests from ${f.origin} cannot change anything here: the Origin header must be this site's own.`, code: 'cross-origin' }
    return null
  }
  if (site) return null
  if (f.hasCookie) {
    return { message: 'A signed-in request that changes something must send an Origin header naming this site.', code: 'origin-required' }
  }
  return null
}

/** application/json or any application/…+json, with or without parameters. */
export function isJsonContentType(value: string | undefined): boolean {
  const type = (value ?? '').split(';')[0]!.trim().toLowerCase()
  return type === 'application/json' || /^application\/[a-z0-9.+-]+\+json$/.test(type)
}

/** Whether the request says it carries a body (a length above 0, or chunked). */
export function declaresBody(req: IncomingMessage): boolean {
  const length = req.headers['content-length']
  if (length !== undefined && length.trim() !== '0') return true
  return /\bchunked\b/i.test(String(req.headers['transfer-encoding'] ?? ''))
}

/** After a refusal: the most of the rest of the body read (and dropped), and for how long. */
const DRAIN_MAX_BYTES = 64 * 1024 * 1024
const DRAIN_MAX_MS = 10_000
/** How long the client has to read the refusal before the connection is cut. */
const DRAIN_AFTER_ANSWER_MS = 2_000

/**
 * Lets the client go on sending for a moment (the bytes are dropped, not kept) so
 * it can read the refusal: cutting the connection while it still sends resets it,
 * and a reset throws away an answer the client has not read yet. The connection is
 * cut 2 s after the answer went out, after 10 s, or after 64 MB, whichever is first.
 */
function drainThenCut(event: H3Event) {
  const req = event.node.req
  let dropped = 0
  const timers: ReturnType<typeof setTimeout>[] = []
  const cut = () => {
    timers.forEach(clearTimeout)
    req.socket?.destroy()
  }
  const later = (ms: number) => {
    const t = setTimeout(cut, ms)
    t.unref?.()
    timers.push(t)
  }
  later(DRAIN_MAX_MS)
  event.node.res.once('finish', () => later(DRAIN_AFTER_ANSWER_MS))
  req.on('data', (chunk: Buffer) => {
    dropped += chunk.length
    if (dropped > DRAIN_MAX_BYTES) cut()
  })
  const done = () => timers.forEach(clearTimeout)
  req.once('end', done)
  req.once('close', done)
  req.resume()
}

/**
 * Reads the body, counting bytes as they arrive; refuses with 413 as soon as it
 * passes `max` (or at once when Content-Length already says so), without ever
 * holding more than `max` bytes.
 */
export function readLimitedBody(event: H3Event, max = JSON_BODY_MAX_BYTES): Promise<Buffer> {
  const req = event.node.req
  const declared = req.headers['content-length']
  if (declared !== undefined) {
    if (!/^\d+$/.test(declared.trim())) {
      throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'The Content-Length header is not a number.', data: { code: 'bad-length' } })
    }
    if (Number(declared) > max) {
      drainThenCut(event)
      tooLarge()
    }
  }
  return new Promise<Buffer>((resolve, reject) => {
    const chunks: Buffer[] = []
    let size = 0
    let done = false
    const finish = (error?: unknown) => {
      if (done) return
      done = true
      req.off('data', onData)
      req.off('end', onEnd)
      req.off('error', onError)
      if (error) reject(error)
      else resolve(Buffer.concat(chunks, size))
    }
    const onData = (chunk: Buffer) => {
      size += chunk.length
      if (size > max) {
        chunks.length = 0
        try {
          tooLarge()
        }
        catch (e) {
          finish(e)
        }
        drainThenCut(event)
        return
      }
      chunks.push(chunk)
    }
    const onEnd = () => finish()
    const onError = (e: Error) => finish(createError({ statusCode: 400, statusMessage: 'Bad Request', message: `The request body could not be read: ${e.message}`, data: { code: 'body-unreadable' } }))
    req.on('data', onData)
    req.on('end', onEnd)
    req.on('error', onError)
  })
}
