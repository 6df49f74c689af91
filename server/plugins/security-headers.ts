// Security headers for production responses. HTML pages get a Content Security
// Policy with a fresh nonce for Nuxt's own inline scripts: no 'unsafe-eval',
// no framing. Responses served over HTTPS (direct TLS, or a trusted proxy's
// X-Forwarded-Proto: https) carry Strict-Transport-Security. Development skips
// this (Vite's client needs eval for HMR).
import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'

const BASE_HEADERS: Record<string, string> = {
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'same-origin',
  'X-Frame-Options': 'DENY',
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Permissions-Policy': 'camera=(), microphone=(), geolocation=(), payment=()',
}

export function contentSecurityPolicy(nonce: string): string {
  return [
    `default-src 'self'`,
    `script-src 'self' 'nonce-${nonce}'`,
    `style-src 'self' 'unsafe-inline'`,
    `img-src 'self' data: blob:`,
    `font-src 'self'`,
    `connect-src 'self'`,
    `object-src 'none'`,
    `base-uri 'self'`,
    `form-action 'self'`,
    `frame-ancestors 'none'`,
  ].join('; ')
}

function withNonce(chunks: string[], nonce: string): string[] {
  return chunks.map(chunk => chunk.replace(/<script(?![^>]*\snonce=)/g, `<script nonce="${nonce}"`))
}

export default defineNitroPlugin((nitro) => {
  if (import.meta.dev) return

  nitro.hooks.hook('request', (event: H3Event) => {
    setResponseHeaders(event, BASE_HEADERS)
    if (servedOverHttps(event)) setResponseHeader(event, 'Strict-Transport-Security', HSTS_VALUE)
    if (!event.path.startsWith('/api/')) return
    setResponseHeader(event, 'Content-Security-Policy', `default-src 'none'; frame-ancestors 'none'`)
    setResponseHeader(event, 'Cache-Control', 'no-store')
  })

  nitro.hooks.hook('render:html', (html, { event }) => {
    const nonce = randomBytes(16).toString('base64')
    html.head = withNonce(html.head, nonce)
    html.bodyPrepend = withNonce(html.bodyPrepend, nonce)
    html.body = withNonce(html.body, nonce)
    html.bodyAppend = withNonce(html.bodyAppend, nonce)
    setResponseHeader(event, 'Content-Security-Policy', contentSecurityPolicy(nonce))
  })
})
