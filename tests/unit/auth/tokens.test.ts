import { describe, expect, it } from 'vitest'
import { RESET_TTL_MINUTES, hashToken, newToken, tokenState } from '~~/server/utils/tokens'
import { throttleFrom } from '~~/server/utils/rate-limit'

describe('single-use tokens', () => {
  it('stores only a hash that matches the token', () => {
    const { token, hash } = newToken()
    expect(hash).toBe(hashToken(token))
    expect(hash).not.toContain(token)
    expect(token.length).toBeGreaterThanOrEqual(40)
    expect(newToken().token).not.toBe(token)
  })

  it('is usable until it expires, then expired', () => {
    const created = new Date('2026-01-01T10:00:00Z')
    const expires = new Date(created.getTime() + RESET_TTL_MINUTES * 60_000).toISOString()
    const record = { expires_at: expires, used_at: null }
    expect(tokenState(record, new Date('2026-01-01T10:59:59Z'))).toBe('usable')
    expect(tokenState(record, new Date('2026-01-01T11:00:00Z'))).toBe('expired')
    expect(tokenState(record, new Date('2026-01-02T00:00:00Z'))).toBe('expired')
  })

  it('is used once used, even before it expires', () => {
    expect(tokenState({ expires_at: '2099-01-01T00:00:00Z', used_at: '2026-01-01T00:00:00Z' })).toBe('used')
  })
})

describe('sign-in throttle', () => {
  const now = Date.parse('2026-01-01T12:00:00Z')
  const minutesAgo = (m: number) => now - m * 60_000

  it('allows five recent failures and blocks the sixth try', () => {
    const four = [1, 2, 3, 4].map(minutesAgo)
    expect(throttleFrom(four, 5, now).limited).toBe(false)
    const five = [1, 2, 3, 4, 5].map(minutesAgo)
    const t = throttleFrom(five, 5, now)
    expect(t.limited).toBe(true)
    // The oldest counting failure (5 min ago) leaves the 15-minute window in 10 minutes.
    expect(t.retryAfterSeconds).toBe(600)
  })

  it('forgets failures older than the window', () => {
    const old = [16, 17, 18, 19, 20].map(minutesAgo)
    expect(throttleFrom(old, 5, now).limited).toBe(false)
  })
})
