// A practice learning platform (the platform side of LTI 1.3) for development and tests
// only: it is never imported by the app and never part of the production build.
// Written from the specifications: LTI Core 1.3 (§4.1 login initiation, §5 claims),
// the LTI Security Framework 1.0 (§5.1 the OIDC launch, §4.1 client credentials),
// OpenID Connect Core 1.0 (§3.1.2.1 authentication request, §3.2.2.5 form_post id_token),
// Deep Linking 2.0 (§4.4 request, §4.5 response) and Assignment and Grade Services 2.0
// (§3.2 line items, §3.4 scores); RFC 7517 key sets, RFC 7519 JWTs, RFC 7523 assertions.
// jose does all the signing and verifying; there is no hand-written cryptography.
import { randomBytes, randomUUID } from 'node:crypto'
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http'
import { SignJWT, createRemoteJWKSet, exportJWK, generateKeyPair, jwtVerify, type JWK } from 'jose'

const LTI = 'https://purl.imsglobal.org/spec/lti/claim/'
const DL = 'https://purl.imsglobal.org/spec/lti-dl/claim/'
const AGS_ENDPOINT = 'https://purl.imsglobal.org/spec/lti-ags/claim/endpoint'
export const PRACTICE_SCOPES = {
  lineItem: 'https://purl.imsglobal.org/spec/lti-ags/scope/lineitem', // AGS 2.0 §3.1
  score: 'https://purl.imsglobal.org/spec/lti-ags/scope/score', // AGS 2.0 §3.1
}
export const ROLES = {
  learner: 'http://purl.imsglobal.org/vocab/lis/v2/membership#Learner', // LTI Core 1.3 §A.2.3
  instructor: 'http://purl.imsglobal.org/vocab/lis/v2/membership#Instructor', // LTI Core 1.3 §A.2.3
  administrator: 'http://purl.imsglobal.org/vocab/lis/v2/system/person#Administrator', // LTI Core 1.3 §A.2.1
}

export interface PracticePerson { sub: string, name: string, email: string, roles: string[] }
export interface PracticeLink { id: string, title: string, lineItemId: string | null, custom: Record<string, string> }
export interface PracticeLineItem { id: string, label: string, scoreMaximum: number, resourceId?: string, resourceLinkId: string }
export interface ReceivedScore { lineItemId: string, userId: string, scoreGiven: number, scoreMaximum: number, activityProgress: string, gradingProgress: string, timestamp: string }

interface SigningKey { kid: string, privateKey: CryptoKey, publicJwk: JWK }
interface Pending { person: PracticePerson, kind: 'link' | 'deep', linkId?: string }

async function makeKey(kid = randomUUID()): Promise<SigningKey> {
  const { privateKey, publicKey } = await generateKeyPair('RS256', { extractable: true })
  return { kid, privateKey, publicJwk: { ...await exportJWK(publicKey), kid, alg: 'RS256', use: 'sig' } }
}

function html(res: ServerResponse, status: number, title: string, body: string) {
  res.writeHead(status, { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' })
  res.end(`<!doctype html><html lang="en-GB"><head><meta charset="utf-8"><title>${esc(title)}</title></head><body><main>${body}</main></body></html>`)
}
function json(res: ServerResponse, status: number, body: unknown, type = 'application/json') {
  res.writeHead(status, { 'content-type': type })
  res.end(JSON.stringify(body))
}
function esc(t: string) {
  return t.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)
}
function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    let size = 0
    const chunks: Buffer[] = []
    req.on('data', (c: Buffer) => {
      size += c.length
      if (size > 256 * 1024) req.destroy()
      else chunks.push(c)
    })
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')))
    req.on('error', reject)
  })
}

export interface TokenOptions {
  nonce: string
  person?: PracticePerson
  messageType?: string
  version?: string
  deploymentId?: string
  aud?: string | string[]
  azp?: string
  iss?: string
  /** seconds from now (negative: already expired) */
  expiresIn?: number
  issuedAt?: number
  /** 'unknown-kid': a key the key set does not hold; 'bad-signature': a stranger's key under a published kid */
  keyFault?: 'unknown-kid' | 'bad-signature'
  linkId?: string
  omit?: string[]
  extra?: Record<string, unknown>
}

export class PracticePlatform {
  readonly clientId = 'cyclodial-practice-client'
  readonly deploymentId = 'practice-deployment-1'
  readonly course: { id: string, label: string, title: string }
  readonly people: Record<'student' | 'tutor' | 'admin', PracticePerson> = {
    student: { sub: 'learner-0001', name: 'Wren Calloway', email: 'wren.calloway@practice-platform.test', roles: [ROLES.learner] },
    tutor: { sub: 'teacher-0001', name: 'Ida Fenwright', email: 'ida.fenwright@practice-platform.test', roles: [ROLES.instructor] },
    admin: { sub: 'admin-0001', name: 'Platform Administrator', email: 'platform.admin@practice-platform.test', roles: [ROLES.administrator] },
  }

  links = new Map<string, PracticeLink>()
  lineItems = new Map<string, PracticeLineItem>()
  scores: ReceivedScore[] = []
  /** tokens the token endpoint gave out, with their scopes */
  accessTokens = new Map<string, string[]>()
  /** the next N score posts answer 503 (to exercise the tool's retries) */
  failNextScores = 0
  log: string[] = []

  private keys: SigningKey[] = []
  private stranger!: SigningKey
  private pending = new Map<string, Pending>()
  private server: Server | null = null
  private toolKeys: ReturnType<typeof createRemoteJWKSet> | null = null
  issuer = ''

  /** `course`: the one course this platform has (another title per test keeps cohort names apart). */
  constructor(readonly toolOrigin: string, course: Partial<PracticePlatform['course']> = {}) {
    this.course = { id: 'course-ortho-2', label: 'ORT2', title: 'Orthoptics, second year (practice course)', ...course }
  }

  get authUrl() { return `${this.issuer}/auth` }
  get tokenUrl() { return `${this.issuer}/token` }
  get jwksUrl() { return `${this.issuer}/jwks` }

  /** The body for POST /api/admin/lti/platforms. */
  registration(name = 'Practice platform') {
    return { name, issuer: this.issuer, clientId: this.clientId, deploymentIds: [this.deploymentId], authUrl: this.authUrl, tokenUrl: this.tokenUrl, jwksUrl: this.jwksUrl }
  }

  async start(port = 0): Promise<void> {
    this.keys = [await makeKey()]
    this.stranger = await makeKey()
    this.server = createServer((req, res) => {
      this.handle(req, res).catch((error) => {
        this.log.push(`error: ${error instanceof Error ? error.message : error}`)
        if (!res.headersSent) json(res, 500, { error: 'server_error' })
      })
    })
    await new Promise<void>(resolve => this.server!.listen(port, '127.0.0.1', resolve))
    const address = this.server.address()
    this.issuer = `http://127.0.0.1:${typeof address === 'object' && address ? address.port : port}`
  }

  async stop(): Promise<void> {
    await new Promise<void>(resolve => this.server ? this.server.close(() => resolve()) : resolve())
  }

  /** A new signing key; the old one stays published (RFC 7517 key set with both). */
  async rotateKey(): Promise<string> {
    const key = await makeKey()
    this.keys.unshift(key)
    return key.kid
  }

  /** The login initiation URL the platform's link sends a browser to (LTI Core 1.3 §4.1). */
  loginUrl(as: 'student' | 'tutor' | 'admin', kind: 'link' | 'deep', linkId?: string, person?: PracticePerson): string {
    const hint = randomBytes(12).toString('base64url')
    this.pending.set(hint, { person: person ?? this.people[as], kind, linkId })
    const url = new URL(`${this.toolOrigin}/api/lti/login`)
    url.searchParams.set('iss', this.issuer)
    url.searchParams.set('login_hint', (person ?? this.people[as]).sub)
    url.searchParams.set('target_link_uri', `${this.toolOrigin}/`)
    url.searchParams.set('lti_message_hint', hint)
    url.searchParams.set('client_id', this.clientId)
    url.searchParams.set('lti_deployment_id', this.deploymentId)
    return url.href
  }

  /** Adds a resource link with a line item directly (as if deep-linked earlier). */
  addLink(title: string, custom: Record<string, string>, scoreMaximum: number): PracticeLink {
    const id = `link-${this.links.size + 1}`
    const lineItemId = `li-${this.lineItems.size + 1}`
    this.lineItems.set(lineItemId, { id: lineItemId, label: title, scoreMaximum, resourceLinkId: id })
    const link = { id, title, lineItemId, custom }
    this.links.set(id, link)
    return link
  }

  /** Signs an id_token; the options break it in exactly one way each. */
  async idToken(o: TokenOptions): Promise<string> {
    const person = o.person ?? this.people.student
    const messageType = o.messageType ?? 'LtiResourceLinkRequest'
    const link = o.linkId ? this.links.get(o.linkId) : undefined
    const claims: Record<string, unknown> = {
      nonce: o.nonce,
      name: person.name,
      email: person.email,
      [`${LTI}message_type`]: messageType,
      [`${LTI}version`]: o.version ?? '1.3.0',
      [`${LTI}deployment_id`]: o.deploymentId ?? this.deploymentId,
      [`${LTI}target_link_uri`]: `${this.toolOrigin}/`,
      [`${LTI}roles`]: person.roles,
      [`${LTI}context`]: { id: this.course.id, label: this.course.label, title: this.course.title, type: ['http://purl.imsglobal.org/vocab/lis/v2/course#CourseOffering'] },
    }
    if (messageType === 'LtiResourceLinkRequest') {
      claims[`${LTI}resource_link`] = { id: link?.id ?? 'link-unbound', title: link?.title ?? 'Cyclodial' }
      if (link?.lineItemId) {
        claims[AGS_ENDPOINT] = {
          scope: [PRACTICE_SCOPES.lineItem, PRACTICE_SCOPES.score],
          lineitems: `${this.issuer}/lineitems`,
          lineitem: `${this.issuer}/lineitems/${link.lineItemId}`,
        }
      }
      if (link?.custom) claims[`${LTI}custom`] = link.custom
    }
    if (messageType === 'LtiDeepLinkingRequest') {
      claims[`${DL}deep_linking_settings`] = {
        deep_link_return_url: `${this.issuer}/deep-link-return`,
        accept_types: ['ltiResourceLink'],
        accept_presentation_document_targets: ['window', 'iframe'],
        accept_multiple: false,
        data: `dl-${randomBytes(6).toString('hex')}`,
      }
    }
    Object.assign(claims, o.extra ?? {})
    for (const key of o.omit ?? []) delete claims[key]
    if (o.azp !== undefined) claims.azp = o.azp
    const key = o.keyFault === 'unknown-kid' ? this.stranger : this.keys[0]!
    const signer = o.keyFault === 'bad-signature' ? this.stranger.privateKey : key.privateKey
    const kid = o.keyFault === 'bad-signature' ? this.keys[0]!.kid : key.kid
    const iat = o.issuedAt ?? Math.floor(Date.now() / 1000)
    return new SignJWT(claims)
      .setProtectedHeader({ alg: 'RS256', kid, typ: 'JWT' })
      .setIssuer(o.iss ?? this.issuer)
      .setSubject(person.sub)
      .setAudience(o.aud ?? this.clientId)
      .setIssuedAt(iat)
      .setExpirationTime(iat + (o.expiresIn ?? 300))
      .sign(signer)
  }

  private async handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const url = new URL(req.url ?? '/', this.issuer)
    const path = url.pathname
    if (req.method === 'GET' && path === '/') return this.home(res)
    if (req.method === 'GET' && path === '/jwks') return json(res, 200, { keys: this.keys.map(k => k.publicJwk) })
    if (req.method === 'GET' && path === '/start') {
      const as = url.searchParams.get('as') === 'tutor' ? 'tutor' : 'student'
      const kind = url.searchParams.get('deep') ? 'deep' : 'link'
      res.writeHead(302, { location: this.loginUrl(as, kind, url.searchParams.get('link') ?? undefined) })
      return void res.end()
    }
    if (req.method === 'GET' && path === '/auth') return this.authorise(url, res)
    if (req.method === 'POST' && path === '/token') return this.token(req, res)
    if (req.method === 'POST' && path === '/deep-link-return') return this.deepLinkReturn(req, res)
    const item = path.match(/^\/lineitems\/([\w-]+)(\/scores)?$/)
    if (item) return this.lineItem(req, res, item[1]!, !!item[2])
    json(res, 404, { error: 'not_found' })
  }

  private home(res: ServerResponse) {
    const links = [...this.links.values()].map(l => `<li>${esc(l.title)} — <a href="/start?as=student&amp;link=${esc(l.id)}">Launch as a student</a> · <a href="/start?as=tutor&amp;link=${esc(l.id)}">Launch as a tutor</a></li>`).join('')
    const scores = this.scores.map(s => `<li>${esc(s.userId)}: ${s.scoreGiven} / ${s.scoreMaximum} (${esc(s.lineItemId)})</li>`).join('')
    html(res, 200, 'Practice platform', `<h1>Practice platform: ${esc(this.course.title)}</h1>
<p><a href="/start?as=tutor&amp;deep=1">Add Cyclodial content as a tutor (deep linking)</a></p>
<p><a href="/start?as=student">Launch as a student</a> · <a href="/start?as=tutor">Launch as a tutor</a></p>
<h2>Resource links</h2><ul id="links">${links || '<li>None yet</li>'}</ul>
<h2>Scores received</h2><ul id="scores">${scores || '<li>None yet</li>'}</ul>`)
  }

  /** The authentication request (OpenID Connect Core 1.0 §3.1.2.1 as LTI Security Framework 1.0 §5.1.1.2 profiles it). */
  private async authorise(url: URL, res: ServerResponse) {
    const q = Object.fromEntries(url.searchParams)
    const problems: string[] = []
    if (q.scope !== 'openid') problems.push('scope must be openid')
    if (q.response_type !== 'id_token') problems.push('response_type must be id_token')
    if (q.response_mode !== 'form_post') problems.push('response_mode must be form_post')
    if (q.prompt !== 'none') problems.push('prompt must be none')
    if (q.client_id !== this.clientId) problems.push('unknown client_id')
    if (q.redirect_uri !== `${this.toolOrigin}/api/lti/launch`) problems.push('redirect_uri is not registered')
    if (!q.state || !q.nonce) problems.push('state and nonce are required')
    const pending = q.lti_message_hint ? this.pending.get(q.lti_message_hint) : undefined
    if (!pending) problems.push('unknown lti_message_hint')
    else if (q.login_hint !== pending.person.sub) problems.push('login_hint does not match')
    if (problems.length) {
      this.log.push(`auth refused: ${problems.join('; ')}`)
      return html(res, 400, 'Refused', `<h1>Authentication request refused</h1><p>${esc(problems.join('; '))}</p>`)
    }
    this.pending.delete(q.lti_message_hint!)
    const token = await this.idToken({
      nonce: q.nonce!,
      person: pending!.person,
      messageType: pending!.kind === 'deep' ? 'LtiDeepLinkingRequest' : 'LtiResourceLinkRequest',
      linkId: pending!.linkId,
    })
    this.autoPost(res, q.redirect_uri!, { id_token: token, state: q.state! })
  }

  private autoPost(res: ServerResponse, action: string, fields: Record<string, string>) {
    const inputs = Object.entries(fields).map(([k, v]) => `<input type="hidden" name="${esc(k)}" value="${esc(v)}">`).join('')
    html(res, 200, 'Launching', `<form id="f" method="post" action="${esc(action)}">${inputs}<button type="submit">Continue</button></form><script>document.getElementById('f').submit()</script>`)
  }

  private tool() {
    this.toolKeys ??= createRemoteJWKSet(new URL(`${this.toolOrigin}/api/lti/jwks`))
    return this.toolKeys
  }

  /** Client credentials with a JWT assertion (LTI Security Framework 1.0 §4.1; RFC 7523 §2.2, §3). */
  private async token(req: IncomingMessage, res: ServerResponse) {
    const form = new URLSearchParams(await readBody(req))
    if (form.get('grant_type') !== 'client_credentials') return json(res, 400, { error: 'unsupported_grant_type' }) // RFC 6749 §5.2
    if (form.get('client_assertion_type') !== 'urn:ietf:params:oauth:client-assertion-type:jwt-bearer') return json(res, 400, { error: 'invalid_request' })
    try {
      await jwtVerify(form.get('client_assertion') ?? '', this.tool(), { issuer: this.clientId, subject: this.clientId, audience: this.tokenUrl, algorithms: ['RS256'], requiredClaims: ['jti', 'exp', 'iat'] })
    }
    catch (error) {
      this.log.push(`token refused: ${error instanceof Error ? error.message : error}`)
      return json(res, 401, { error: 'invalid_client' })
    }
    const allowed = new Set(Object.values(PRACTICE_SCOPES))
    const scopes = (form.get('scope') ?? '').split(' ').filter(Boolean)
    if (!scopes.length || scopes.some(s => !allowed.has(s))) return json(res, 400, { error: 'invalid_scope' })
    const token = randomBytes(24).toString('base64url')
    this.accessTokens.set(token, scopes)
    json(res, 200, { access_token: token, token_type: 'Bearer', expires_in: 3600, scope: scopes.join(' ') })
  }

  private bearer(req: IncomingMessage): string[] | null {
    const m = /^Bearer (\S+)$/.exec(String(req.headers.authorization ?? ''))
    return m ? this.accessTokens.get(m[1]!) ?? null : null
  }

  /** Deep Linking 2.0 §4.5: the tool's signed response; one resource link and its line item are made. */
  private async deepLinkReturn(req: IncomingMessage, res: ServerResponse) {
    const form = new URLSearchParams(await readBody(req))
    let payload: Record<string, unknown>
    try {
      payload = (await jwtVerify(form.get('JWT') ?? '', this.tool(), { issuer: this.clientId, audience: this.issuer, algorithms: ['RS256'], requiredClaims: ['nonce', 'iat', 'exp'] })).payload as Record<string, unknown>
    }
    catch (error) {
      this.log.push(`deep link refused: ${error instanceof Error ? error.message : error}`)
      return html(res, 400, 'Refused', '<h1>The tool\'s response did not verify</h1>')
    }
    if (payload[`${LTI}message_type`] !== 'LtiDeepLinkingResponse' || payload[`${LTI}version`] !== '1.3.0' || payload[`${LTI}deployment_id`] !== this.deploymentId) {
      return html(res, 400, 'Refused', '<h1>Not a deep linking response for this deployment</h1>')
    }
    const items = (payload[`${DL}content_items`] ?? []) as { type?: string, title?: string, lineItem?: { scoreMaximum?: number, label?: string, resourceId?: string }, custom?: Record<string, string> }[]
    const added: PracticeLink[] = []
    for (const item of items) {
      if (item.type !== 'ltiResourceLink') continue
      const id = `link-${this.links.size + 1}`
      let lineItemId: string | null = null
      if (item.lineItem && typeof item.lineItem.scoreMaximum === 'number' && item.lineItem.scoreMaximum > 0) {
        lineItemId = `li-${this.lineItems.size + 1}`
        this.lineItems.set(lineItemId, { id: lineItemId, label: item.lineItem.label ?? item.title ?? 'Cyclodial', scoreMaximum: item.lineItem.scoreMaximum, resourceId: item.lineItem.resourceId, resourceLinkId: id })
      }
      const link = { id, title: item.title ?? 'Cyclodial', lineItemId, custom: item.custom ?? {} }
      this.links.set(id, link)
      added.push(link)
    }
    html(res, 200, 'Added to the course', `<h1>Added to the course</h1><ul id="added">${added.map(l => `<li data-link="${esc(l.id)}">${esc(l.title)}${l.lineItemId ? ` (out of ${this.lineItems.get(l.lineItemId)!.scoreMaximum})` : ''}</li>`).join('')}</ul><p><a href="/">Back to the course</a></p>`)
  }

  /** AGS 2.0 §3.2 (a line item) and §3.4 (posting a score). */
  private async lineItem(req: IncomingMessage, res: ServerResponse, id: string, scores: boolean) {
    const item = this.lineItems.get(id)
    const scopes = this.bearer(req)
    if (!scopes) return json(res, 401, { error: 'invalid_token' })
    if (!item) return json(res, 404, { error: 'no such line item' })
    if (!scores) {
      if (req.method !== 'GET') return json(res, 405, { error: 'method' })
      return json(res, 200, { id: `${this.issuer}/lineitems/${id}`, label: item.label, scoreMaximum: item.scoreMaximum, resourceId: item.resourceId, resourceLinkId: item.resourceLinkId }, 'application/vnd.ims.lis.v2.lineitem+json')
    }
    if (req.method !== 'POST') return json(res, 405, { error: 'method' })
    if (!scopes.includes(PRACTICE_SCOPES.score)) return json(res, 403, { error: 'insufficient_scope' })
    if (!String(req.headers['content-type'] ?? '').startsWith('application/vnd.ims.lis.v1.score+json')) return json(res, 415, { error: 'content type' })
    const body = JSON.parse(await readBody(req)) as ReceivedScore
    if (this.failNextScores > 0) {
      this.failNextScores--
      return json(res, 503, { error: 'try again later' })
    }
    const valid = typeof body.userId === 'string' && typeof body.scoreGiven === 'number' && typeof body.scoreMaximum === 'number' && body.scoreMaximum > 0
      && ['Initialized', 'Started', 'InProgress', 'Submitted', 'Completed'].includes(body.activityProgress) // AGS 2.0 §3.4.6
      && ['FullyGraded', 'Pending', 'PendingManual', 'Failed', 'NotReady'].includes(body.gradingProgress) // AGS 2.0 §3.4.7
      && typeof body.timestamp === 'string' && !Number.isNaN(Date.parse(body.timestamp))
    if (!valid) return json(res, 400, { error: 'invalid score' })
    this.scores.push({ ...body, lineItemId: id })
    res.writeHead(204)
    res.end()
  }
}
