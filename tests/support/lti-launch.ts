// The browser side of LTI 1.3 launches against the built server and the practice
// platform (tests/support/lti-platform.ts), for the API tests: people, the OIDC login,
// the platform's form post and a whole launch. Bind it to a running server and
// platform with launchKit(() => ({ server, platform })).
import { expect } from 'vitest'
import type { Client, Reply } from './client'
import { readDb } from './db'
import { ROLES, type PracticePerson, type PracticePlatform } from './lti-platform'
import type { RunningServer } from './server'

export function launchKit(ctx: () => { server: RunningServer, platform: PracticePlatform }) {
  let people = 0
  function person(role: 'learner' | 'instructor' | 'administrator' = 'learner'): PracticePerson {
    people++
    return { sub: `p-${role}-${people}`, name: `Person ${people}`, email: `person${people}@practice-platform.test`, roles: [ROLES[role]] }
  }

  /** Starts a login as a browser would; returns the state and nonce the tool sent to the platform. */
  async function login(browser: Client, who: PracticePerson, kind: 'link' | 'deep' = 'link', linkId?: string) {
    const url = new URL(ctx().platform.loginUrl('student', kind, linkId, who))
    const reply = await browser.get(`${url.pathname}${url.search}`)
    expect(reply.status, String(reply.body)).toBe(302)
    const auth = new URL(reply.headers.get('location')!)
    return { auth, state: auth.searchParams.get('state')!, nonce: auth.searchParams.get('nonce')! }
  }

  /** The platform's form_post of the id_token (a cross-site POST: the platform's Origin). */
  function postLaunch(browser: Client, fields: Record<string, string>): Promise<Reply> {
    return browser.request('POST', '/api/lti/launch', undefined, {
      raw: new URLSearchParams(fields).toString(),
      headers: { 'content-type': 'application/x-www-form-urlencoded', 'origin': ctx().platform.issuer, 'sec-fetch-site': 'cross-site', 'accept': 'text/html' },
    })
  }

  /** A whole launch in one browser: login, the platform's token, the post, the finish. Returns where it landed. */
  async function launch(browser: Client, who: PracticePerson, kind: 'link' | 'deep' = 'link', linkId?: string): Promise<string> {
    const { state, nonce } = await login(browser, who, kind, linkId)
    const token = await ctx().platform.idToken({ nonce, person: who, messageType: kind === 'deep' ? 'LtiDeepLinkingRequest' : 'LtiResourceLinkRequest', linkId })
    const posted = await postLaunch(browser, { id_token: token, state })
    expect(posted.status, String(posted.body)).toBe(303)
    const finish = await browser.get(posted.headers.get('location')!)
    expect(finish.status, String(finish.body)).toBe(302)
    return finish.headers.get('location')!
  }

  function accountsOf(email: string): number {
    const db = readDb(ctx().server.dbPath)
    try {
      return db.count('select count(*) as n from users where email = ?', email)
    }
    finally {
      db.close()
    }
  }

  async function until(check: () => boolean, timeoutMs = 10_000) {
    const deadline = Date.now() + timeoutMs
    while (!check()) {
      if (Date.now() > deadline) throw new Error(`timed out; platform log: ${ctx().platform.log.join(' | ')}`)
      await new Promise(r => setTimeout(r, 100))
    }
  }

  return { person, login, postLaunch, launch, accountsOf, until }
}
