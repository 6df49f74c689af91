import { describe, expect, it } from 'vitest'
import { DATE_FALLBACK_LOCALE, pickDateLocale } from '~~/utils/format-dates'

describe('the reader\'s locale for dates', () => {
  it('takes the first usable tag of Accept-Language (RFC 9110 §12.5.4: tags in order, q-values after ";")', () => {
    expect(pickDateLocale('de-CH,de;q=0.9,en;q=0.8')).toBe('de-CH')
    expect(pickDateLocale('*, en-US;q=0.5')).toBe('en-US')
    expect(pickDateLocale(' en-AU ; q=1')).toBe('en-AU')
  })

  it('falls back to British English when nothing usable is sent', () => {
    expect(DATE_FALLBACK_LOCALE).toBe('en-GB')
    expect(pickDateLocale(undefined)).toBe('en-GB')
    expect(pickDateLocale('')).toBe('en-GB')
    expect(pickDateLocale('not a tag!!, ***')).toBe('en-GB')
  })
})
