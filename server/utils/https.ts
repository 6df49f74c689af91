// Whether a request reached Cyclodial over HTTPS: directly over TLS, or through a
// trusted reverse proxy (NUXT_TRUSTED_PROXIES, the one proxy setting) that says so
// in X-Forwarded-Proto. From anyone else the header is ignored: anyone can send it.
import type { TLSSocket } from 'node:tls'
import type { H3Event } from 'h3'
import { fromTrustedProxy } from './client-address'

export function servedOverHttps(event: H3Event): boolean {
  if ((event.node.req.socket as TLSSocket | undefined)?.encrypted) return true
  if (!fromTrustedProxy(event)) return false
  const proto = String(event.node.req.headers['x-forwarded-proto'] ?? '').split(',')[0]!.trim().toLowerCase()
  return proto === 'https'
}

/** One year, subdomains included (OWASP HTTP Strict Transport Security Cheat Sheet). */
export const HSTS_VALUE = 'max-age=31536000; includeSubDomains'
