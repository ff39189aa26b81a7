// "May this role do X": the shared table against the role table in README.md ("Accounts and roles").
import { describe, expect, it } from 'vitest'
import { roleMay, whoMay, PERMISSIONS } from '../../shared/permissions'
import { ROLE_NAMES } from '../../shared/roles'

describe('role permissions', () => {
  it('lets every role but viewer export (README: viewer "read only"; underwriter and asset manager "export")', () => {
    expect(ROLE_NAMES.filter(r => roleMay(r, 'export'))).toEqual(['admin', 'analyst', 'underwriter', 'asset_manager'])
  })
  it('gives capital plans to admins and asset managers, inventory and runs to admins and analysts (README role table)', () => {
    expect(ROLE_NAMES.filter(r => roleMay(r, 'plan'))).toEqual(['admin', 'asset_manager'])
    expect(ROLE_NAMES.filter(r => roleMay(r, 'editInventory'))).toEqual(['admin', 'analyst'])
    expect(ROLE_NAMES.filter(r => roleMay(r, 'startRuns'))).toEqual(['admin', 'analyst'])
    expect(ROLE_NAMES.filter(r => roleMay(r, 'underwrite'))).toEqual(['admin', 'underwriter'])
  })
  it('refuses everything without a role, and names who may in words', () => {
    for (const p of Object.keys(PERMISSIONS) as (keyof typeof PERMISSIONS)[]) expect(roleMay(null, p)).toBe(false)
    expect(whoMay('evaluateActions')).toBe('admins and analysts')
    expect(whoMay('export')).toBe('admins, analysts, underwriters and asset managers')
  })
})
