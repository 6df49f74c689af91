// The pure rules behind issue 12 points 10, 12 and 15: the CSV writer's formula
// guard, the cross-site decision and the session-password check.
import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { neutraliseCell, writeCsv } from '~~/server/utils/csv'
import { crossSiteProblem, isJsonContentType } from '~~/server/utils/request-guard'
import { repeatingBlock, sessionPasswordProblem } from '~~/server/utils/session-password'
import { hasControlCharacters } from '#shared/schemas/text'

describe('CSV writer', () => {
  // OWASP "CSV Injection": = + - @ tab and carriage return start a formula
  it.each([
    ['=1+1', '\'=1+1'],
    ['+1', '\'+1'],
    ['-1', '\'-1'],
    ['@SUM(A1)', '\'@SUM(A1)'],
    ['\t=1', '\'\t=1'],
    ['\r=1', '\'\r\'=1'], // the cell, and the line after the carriage return
    ['  =1+1', '\'  =1+1'], // leading white space is trimmed by spreadsheets (from memory)
    ['=HYPERLINK("x")\nname', '\'=HYPERLINK("x")\nname'], // a line break after the formula
    ['name\n=HYPERLINK("x")', 'name\n\'=HYPERLINK("x")'], // a formula after a line break
    ['\uFF1D1+1', '\'\uFF1D1+1'], // full-width equals sign (from memory)
    ['Tamsin Arkwell', 'Tamsin Arkwell'],
    ['a-b = c', 'a-b = c'],
  ])('neutralises %j', (input, output) => {
    expect(neutraliseCell(input)).toBe(output)
  })

  it('keeps numbers as numbers and empties null, undefined and non-finite numbers', () => {
    expect(neutraliseCell(-3)).toBe(-3)
    expect(neutraliseCell(null)).toBe('')
    expect(neutraliseCell(undefined)).toBe('')
    expect(neutraliseCell(Number.NaN)).toBe('')
  })

  it('writes RFC 4180 text (CRLF, quoted where needed) that reads back to the neutralised cells', () => {
    const text = writeCsv(['name', 'score'], [['=cmd\nx', 1], ['plain, with comma', -2]], { bom: true })
    expect(text.startsWith('\uFEFF')).toBe(true)
    expect(text.endsWith('\r\n')).toBe(true)
    const rows = Papa.parse<string[]>(text.slice(1).trim()).data
    expect(rows).toEqual([['name', 'score'], ['\'=cmd\nx', '1'], ['plain, with comma', '-2']])
  })
})

describe('one-line names', () => {
  it('finds C0 and C1 controls and Unicode line separators, and nothing in ordinary names', () => {
    for (const bad of ['a\nb', 'a\rb', 'a\tb', 'a\u0000', 'a\u007F', 'a\u0085', 'a\u2028b', 'a\u2029b']) expect(hasControlCharacters(bad), JSON.stringify(bad)).toBe(true)
    for (const good of ['Tamsin Arkwell', 'Zoë O\'Brien-Ng', 'Søren Ø', '山田 花子']) expect(hasControlCharacters(good)).toBe(false)
  })
})

describe('cross-site decision', () => {
  const base = { origin: undefined, secFetchSite: undefined, host: '127.0.0.1:3000', hasCookie: true, siteUrl: '' }
  it('compares Origin with the configured site URL, or with Host when none is configured', () => {
    expect(crossSiteProblem({ ...base, origin: 'http://127.0.0.1:3000' })).toBeNull()
    expect(crossSiteProblem({ ...base, origin: 'http://127.0.0.1:3001' })?.code).toBe('cross-origin')
    expect(crossSiteProblem({ ...base, siteUrl: 'https://cyclodial.example.org/', origin: 'https://cyclodial.example.org' })).toBeNull()
    // with a site URL configured, a matching Host is not enough
    expect(crossSiteProblem({ ...base, siteUrl: 'https://cyclodial.example.org', origin: 'http://127.0.0.1:3000' })?.code).toBe('cross-origin')
    expect(crossSiteProblem({ ...base, siteUrl: 'https://cyclodial.example.org', origin: 'https://evil.example.org' })?.code).toBe('cross-origin')
    expect(crossSiteProblem({ ...base, origin: 'null' })?.code).toBe('cross-origin')
  })
  it('follows Sec-Fetch-Site (Fetch Metadata) and asks a cookie-carrying request without either header for its Origin', () => {
    expect(crossSiteProblem({ ...base, secFetchSite: 'same-origin' })).toBeNull()
    expect(crossSiteProblem({ ...base, secFetchSite: 'none' })).toBeNull()
    expect(crossSiteProblem({ ...base, secFetchSite: 'same-site' })?.code).toBe('cross-site')
    expect(crossSiteProblem({ ...base, secFetchSite: 'cross-site', origin: 'http://127.0.0.1:3000' })?.code).toBe('cross-site')
    expect(crossSiteProblem(base)?.code).toBe('origin-required')
    expect(crossSiteProblem({ ...base, hasCookie: false })).toBeNull()
  })
  it('knows a JSON content type', () => {
    for (const t of ['application/json', 'application/json; charset=utf-8', 'Application/JSON', 'application/merge-patch+json']) expect(isJsonContentType(t), t).toBe(true)
    for (const t of ['text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x', 'text/json', '', undefined]) expect(isJsonContentType(t), String(t)).toBe(false)
  })
})

describe('session password', () => {
  it('refuses short, repeated and low-variety passwords; accepts random ones', () => {
    expect(sessionPasswordProblem('short')).toMatch(/at least 32/)
    expect(repeatingBlock('abcabcabcab')).toBe('abc')
    expect(sessionPasswordProblem('x'.repeat(64))).toMatch(/1 character\) repeated/)
    expect(sessionPasswordProblem('0123456789abcdef'.repeat(2))).toMatch(/16 characters\) repeated/)
    expect(sessionPasswordProblem('aaaaaaaaaaaaaaaabbbbbbbbbbbbbbbbcccc')).toMatch(/only 3 different/)
    expect(sessionPasswordProblem('test-only-session-password-0123456789abcdef')).toBeNull()
    expect(sessionPasswordProblem('9f86d081884c7d659a2feaa0c55ad015a3bf4f1b2b0b822cd15d6c15b0f00a08')).toBeNull()
  })
})
