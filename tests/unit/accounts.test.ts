// Password rules, public pages, role visibility and the post-sign-in redirect (shared by pages and routes).
import { describe, expect, it } from 'vitest'
import { passwordProblem, signInSchema } from '../../shared/schemas/auth'
import { isPublicPath, roleMaySee, safeNext } from '../../shared/access'
import { sectionsForRole } from '../../shared/navigation'

describe('password rules (the issue: length ≥ 12, not the e-mail)', () => {
  it('asks for at least 12 characters', () => {
    expect(passwordProblem('elevenchars', 'a@example.test')).toBe('Use at least 12 characters.')
    expect(passwordProblem('twelve chars', 'a@example.test')).toBeNull()
  })
  it('refuses the e-mail address and the part before the @, whatever the case', () => {
    expect(passwordProblem('Long.Name.Person@Example.test', 'long.name.person@example.test')).toMatch(/e-mail/)
    expect(passwordProblem('long.name.person', 'long.name.person@example.test')).toMatch(/e-mail/)
    expect(passwordProblem('long.name.person!', 'long.name.person@example.test')).toBeNull()
  })
  it('refuses passwords too long to hash cheaply', () => {
    expect(passwordProblem('x'.repeat(201), 'a@example.test')).toMatch(/at most/)
  })
  it('reads e-mail addresses trimmed and in lower case', () => {
    expect(signInSchema.parse({ email: '  Admin@CobaltRidge.example ', password: 'p' }).email).toBe('admin@cobaltridge.example')
  })
})

describe('page access (middleware)', () => {
  it('leaves the front page, sign-in, reset and invitation pages open', () => {
    for (const p of ['/', '/sign-in', '/reset-password', '/reset-password/abc', '/invitations/abc', '/methodology']) expect(isPublicPath(p), p).toBe(true)
    for (const p of ['/overview', '/admin', '/profile', '/invitations', '/sign-inx', '/reset-passwordx']) expect(isPublicPath(p), p).toBe(false)
  })
  it('keeps admin pages to admins and calibration to admins and analysts', () => {
    expect(roleMaySee('/admin/members', 'admin')).toBe(true)
    expect(roleMaySee('/admin/members', 'analyst')).toBe(false)
    expect(roleMaySee('/administrators', 'viewer')).toBe(true) // not the /admin section
    expect(roleMaySee('/calibration', 'viewer')).toBe(false)
    expect(roleMaySee('/sites/123', 'viewer')).toBe(true)
    expect(sectionsForRole('viewer').map(s => s.label)).not.toContain('Admin')
    // README "Insurance terms": every member reads terms, so every role sees Insurance.
    for (const role of ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer'] as const) {
      expect(roleMaySee('/insurance/abc', role)).toBe(true)
      expect(sectionsForRole(role).map(s => s.label)).toContain('Insurance')
    }
  })
  it('follows only paths inside the app after sign-in', () => {
    expect(safeNext('/sites/1?tab=tanks')).toBe('/sites/1?tab=tanks')
    for (const bad of ['https://elsewhere.example', '//elsewhere.example', '/\\elsewhere.example', undefined, ['/a']]) expect(safeNext(bad)).toBe('/overview')
  })
})
