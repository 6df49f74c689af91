// The client's address, for sign-in limits and reset-mail limits. Proxy headers
// (X-Forwarded-For) are believed only from a configured trusted proxy
// (NUXT_TRUSTED_PROXIES: comma-separated addresses or CIDR ranges, or the
// proxy-addr names loopback, linklocal, uniquelocal); otherwise anyone could
// pick their own address per request, or pin someone else's.
import type { H3Event } from 'h3'
import proxyaddr from 'proxy-addr'

let compiled: { raw: string, trust: (addr: string, i: number) => boolean } | undefined

function trust(): (addr: string, i: number) => boolean {
  const raw = String(useRuntimeConfig().trustedProxies ?? '').trim()
  if (!compiled || compiled.raw !== raw) {
    const list = raw.split(/[\s,]+/).filter(Boolean)
    let fn: (addr: string, i: number) => boolean
    try {
      fn = list.length ? proxyaddr.compile(list) : () => false
    }
    catch (error) {
      console.error(`[cyclodial] NUXT_TRUSTED_PROXIES is not valid (${error instanceof Error ? error.message : error}); trusting no proxy.`)
      fn = () => false
    }
    compiled = { raw, trust: fn }
  }
  return compiled.trust
}

/** Whether the connection comes straight from a configured trusted proxy (whose X-Forwarded-* headers count). */
export function fromTrustedProxy(event: H3Event): boolean {
  const addr = event.node.req.socket?.remoteAddress
  return !!addr && trust()(addr, 0)
}

export function clientAddress(event: H3Event): string {
  try {
    return proxyaddr(event.node.req, trust()) || 'unknown'
  }
  catch {
    return event.node.req.socket?.remoteAddress ?? 'unknown'
  }
}
