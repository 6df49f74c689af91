// Whether a request reached Cyclodial over HTTPS: directly over TLS, or through a
// trusted reverse proxy (NUXT_TRUSTED_PROXY set) that says so in X-Forwarded-Proto.
// Without a trusted proxy the header is ignored: anyone can send it.
import type { TLSSocket } from 'node:tls'
import type { H3Event } from 'h3'

export function trustedProxyConfigured(value: unknown): boolean {
  const v = String(value ?? '').trim().toLowerCase()
  return v !== '' && v !== '0' && v !== 'false' && v !== 'no'
}

export function servedOverHttps(event: H3Event, trustProxy: boolean): boolean {
  if ((event.node.req.socket as TLSSocket | undefined)?.encrypted) return true
  if (!trustProxy) return false
  const proto = String(event.node.req.headers['x-forwarded-proto'] ?? '').split(',')[0]!.trim().toLowerCase()
  return proto === 'https'
}

/** One year, subdomains included (OWASP HTTP Strict Transport Security Cheat Sheet). */
export const HSTS_VALUE = 'max-age=31536000; includeSubDomains'
