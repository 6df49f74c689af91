import { describe, expect, it } from 'vitest'
import { ROLES, homeFor, isRole, roleAllowed, safeRedirect } from '#shared/auth/roles'

describe('role rules', () => {
  it('gives every role its own home', () => {
    const homes = ROLES.map(homeFor)
    expect(new Set(homes).size).toBe(ROLES.length)
    expect(homeFor('student')).toBe('/student')
    expect(homeFor('admin')).toBe('/admin')
  })

  it('allows only the listed roles', () => {
    expect(roleAllowed('tutor', ['tutor', 'lecturer'])).toBe(true)
    expect(roleAllowed('student', ['tutor', 'lecturer'])).toBe(false)
    expect(roleAllowed(undefined, ['student'])).toBe(false)
    expect(roleAllowed(null, ['admin'])).toBe(false)
  })

  it('recognises roles and nothing else', () => {
    for (const r of ROLES) expect(isRole(r)).toBe(true)
    for (const bad of ['Admin', 'superuser', '', 3, null]) expect(isRole(bad)).toBe(false)
  })

  it('keeps redirects after sign-in on this site', () => {
    expect(safeRedirect('/admin/users?page=2', '/x')).toBe('/admin/users?page=2')
    for (const bad of ['//evil.example/x', 'https://evil.example', '/\\evil.example', 'javascript:alert(1)', '/a\nb', 42, undefined]) {
      expect(safeRedirect(bad, '/home')).toBe('/home')
    }
  })
})
