// Small HTML pages the LTI routes answer with: a refusal (a clear page and a 4xx),
// a form that posts itself to a platform, and the hand-off shown inside a platform's
// frame (Cyclodial opens in a new window; see docs/lti.md).
import { randomBytes } from 'node:crypto'
import { setResponseHeader, setResponseStatus, type H3Event } from 'h3'

const CAUTION = 'Cyclodial is a simulation for education; real assessment follows local protocols under licensed clinical supervision.'

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)
}

function page(title: string, body: string, nonce?: string, script?: string): string {
  return `<!doctype html>
<html lang="en-GB"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)} · Cyclodial</title>
<style>body{font-family:system-ui,sans-serif;max-width:40rem;margin:3rem auto;padding:0 1rem;color:#1b2430;line-height:1.5}h1{font-size:1.5rem}a,button{color:#0b4f8a}button{font:inherit;padding:.5rem 1rem;border:2px solid #0b4f8a;background:#fff;border-radius:.375rem;cursor:pointer}small{color:#3d4a5c}</style>
</head><body><main>${body}<p><small>${escapeHtml(CAUTION)}</small></p></main>${script ? `<script nonce="${nonce}">${script}</script>` : ''}</body></html>`
}

export class LtiRefusal extends Error {
  constructor(readonly status: number, readonly code: string, message: string, readonly field?: string) {
    super(message)
  }
}

/** A refusal as a page: the status, the reason in words, the stable code for scripts. */
export function refusalPage(event: H3Event, refusal: LtiRefusal): string {
  setResponseStatus(event, refusal.status)
  setResponseHeader(event, 'Content-Type', 'text/html; charset=utf-8')
  setResponseHeader(event, 'Cache-Control', 'no-store')
  setResponseHeader(event, 'X-Lti-Refusal', refusal.code)
  setResponseHeader(event, 'Content-Security-Policy', `default-src 'none'; style-src 'unsafe-inline'; frame-ancestors 'none'`)
  return page('The launch was refused', `<h1>The launch from your learning platform was refused</h1>
<p>${escapeHtml(refusal.message)}</p>
<p>Nothing was changed. Go back to your course and open the link again; if it keeps happening, tell the person who looks after the course, quoting <code>${escapeHtml(refusal.code)}</code>.</p>`)
}

/** A form that posts itself (to a platform): CSP allows this one script and that one target. */
export function autoPostPage(event: H3Event, action: string, fields: Record<string, string>, title: string): string {
  const nonce = randomBytes(16).toString('base64')
  const target = new URL(action).origin
  setResponseHeader(event, 'Content-Type', 'text/html; charset=utf-8')
  setResponseHeader(event, 'Cache-Control', 'no-store')
  setResponseHeader(event, 'Content-Security-Policy', `default-src 'none'; style-src 'unsafe-inline'; script-src 'nonce-${nonce}'; form-action ${target}; frame-ancestors 'none'`)
  const inputs = Object.entries(fields).map(([k, v]) => `<input type="hidden" name="${escapeHtml(k)}" value="${escapeHtml(v)}">`).join('')
  return page(title, `<h1>${escapeHtml(title)}</h1>
<form id="send" method="post" action="${escapeHtml(action)}">${inputs}<p>Returning to your learning platform… If nothing happens, <button type="submit">continue</button>.</p></form>`, nonce, `document.getElementById('send').submit()`)
}

/**
 * Inside a platform's frame: Cyclodial opens in its own window (session cookies stay
 * SameSite=Lax). Only the registered platform's origins may frame this page.
 */
export function newWindowPage(event: H3Event, loginUrl: string, frameOrigins: string[]): string {
  setResponseHeader(event, 'Content-Type', 'text/html; charset=utf-8')
  setResponseHeader(event, 'Cache-Control', 'no-store')
  event.node.res.removeHeader('X-Frame-Options')
  setResponseHeader(event, 'Content-Security-Policy', `default-src 'none'; style-src 'unsafe-inline'; frame-ancestors ${frameOrigins.join(' ')}`)
  return page('Open Cyclodial', `<h1>Cyclodial opens in its own window</h1>
<p>Your course shows Cyclodial inside a frame. To keep your sign-in safe, Cyclodial works in a window of its own.</p>
<p><a href="${escapeHtml(loginUrl)}" target="_blank" rel="noopener">Open Cyclodial in a new window</a></p>`)
}
