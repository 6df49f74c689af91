// A tiny HTTP client with a cookie jar, for talking to the built server the way
// a browser would (sealed session cookie included, and an Origin header naming the
// site on every request that changes something, as browsers send).
export interface Reply<T = any> { status: number, body: T, headers: Headers }

export class Client {
  private cookies = new Map<string, string>()
  /** `siteOrigin`: the public origin the server is configured with, when it is not the address it listens on. */
  constructor(readonly baseURL: string, readonly siteOrigin?: string) {}

  async request<T = any>(method: string, path: string, body?: unknown, init: { raw?: string, headers?: Record<string, string> } = {}): Promise<Reply<T>> {
    const headers: Record<string, string> = { accept: 'application/json', ...this.originFor(method), ...init.headers }
    // an explicit empty header in init.headers means "send none" (cross-site tests)
    for (const [k, v] of Object.entries(headers)) if (v === '') delete headers[k]
    if (this.cookies.size) headers.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
    let payload: string | undefined
    if (init.raw !== undefined) {
      payload = init.raw
      headers['content-type'] ??= 'application/json'
    }
    else if (body !== undefined) {
      payload = JSON.stringify(body)
      headers['content-type'] = 'application/json'
    }
    const res = await fetch(`${this.baseURL}${path}`, { method, headers, body: payload, redirect: 'manual' })
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(';')
      const eq = pair!.indexOf('=')
      const name = pair!.slice(0, eq).trim()
      const value = pair!.slice(eq + 1).trim()
      if (!value || /max-age=0|expires=thu, 01 jan 1970/i.test(line)) this.cookies.delete(name)
      else this.cookies.set(name, value)
    }
    const text = await res.text()
    let parsed: unknown = text
    if ((res.headers.get('content-type') ?? '').includes('json') && text) parsed = JSON.parse(text)
    return { status: res.status, body: parsed as T, headers: res.headers }
  }

  /** Browsers send Origin on every POST, PUT, PATCH and DELETE (Fetch standard). */
  private originFor(method: string): Record<string, string> {
    return ['GET', 'HEAD'].includes(method.toUpperCase()) ? {} : { origin: this.siteOrigin ?? new URL(this.baseURL).origin }
  }

  /** A multipart upload (e.g. a roster file), with this client's session. */
  async postForm<T = any>(path: string, form: FormData): Promise<Reply<T>> {
    const headers: Record<string, string> = { accept: 'application/json', ...this.originFor('POST') }
    if (this.cookies.size) headers.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
    const res = await fetch(`${this.baseURL}${path}`, { method: 'POST', headers, body: form, redirect: 'manual' })
    const text = await res.text()
    const body = (res.headers.get('content-type') ?? '').includes('json') && text ? JSON.parse(text) : text
    return { status: res.status, body: body as T, headers: res.headers }
  }

  /**
   * The same browser talking to another instance behind the load balancer: a new
   * client on `baseURL` with a COPY of this one's cookies (later changes to either
   * jar stay in that jar), sending the same site Origin.
   */
  copyTo(baseURL: string): Client {
    const other = new Client(baseURL, this.siteOrigin ?? new URL(this.baseURL).origin)
    for (const [k, v] of this.cookies) other.cookies.set(k, v)
    return other
  }

  get<T = any>(path: string) { return this.request<T>('GET', path) }
  post<T = any>(path: string, body?: unknown) { return this.request<T>('POST', path, body) }
  patch<T = any>(path: string, body?: unknown) { return this.request<T>('PATCH', path, body) }
  put<T = any>(path: string, body?: unknown) { return this.request<T>('PUT', path, body) }
  delete<T = any>(path: string) { return this.request<T>('DELETE', path) }

  /** Raw bytes of a GET (images and other downloads). */
  async bytes(path: string): Promise<{ status: number, body: Buffer, headers: Headers }> {
    const headers: Record<string, string> = {}
    if (this.cookies.size) headers.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
    const res = await fetch(`${this.baseURL}${path}`, { headers, redirect: 'manual' })
    return { status: res.status, body: Buffer.from(await res.arrayBuffer()), headers: res.headers }
  }

  async signIn(email: string, password = 'cyclodial-demo'): Promise<Reply> {
    const reply = await this.post('/api/auth/login', { email, password })
    if (reply.status !== 200) throw new Error(`sign-in as ${email} failed: ${reply.status} ${JSON.stringify(reply.body)}`)
    return reply
  }
}

export const DEMO = {
  admin: 'admin@cyclodial.test',
  lecturer: 'lecturer@cyclodial.test',
  tutor: 'tutor@cyclodial.test',
  tutor2: 'tutor2@cyclodial.test',
  student: 'student@cyclodial.test',
} as const

export async function signedIn(baseURL: string, email: string, siteOrigin?: string): Promise<Client> {
  const client = new Client(baseURL, siteOrigin)
  await client.signIn(email)
  return client
}

/** Waits for an outbox message to `to` whose subject matches, via the admin API. */
export async function waitForMail(admin: Client, to: string, subject: RegExp, timeoutMs = 10_000): Promise<{ id: number, subject: string, text: string }> {
  const deadline = Date.now() + timeoutMs
  for (;;) {
    const list = await admin.get<{ items: { id: number, to: string, subject: string }[] }>('/api/admin/outbox?pageSize=100')
    const hit = list.body.items.find(m => m.to.includes(to) && subject.test(m.subject))
    if (hit) return (await admin.get(`/api/admin/outbox/${hit.id}`)).body
    if (Date.now() > deadline) throw new Error(`no mail to ${to} matching ${subject}`)
    await new Promise(r => setTimeout(r, 100))
  }
}

export function linkIn(text: string, path: string): string {
  const match = text.match(new RegExp(`https?://[^\\s]+${path}/[A-Za-z0-9_-]+`))
  if (!match) throw new Error(`no ${path} link in:\n${text}`)
  return match[0]
}
