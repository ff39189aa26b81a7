// The sections of the left rail (SCREENS.md "Frame") and which roles see each.
import { EDITOR_ROLES, type RoleName } from './roles'

export type { RoleName }

export interface NavSection {
  label: string
  to: string
  /** Roles that see the section; undefined = every member. */
  roles?: RoleName[]
}

export const navSections: NavSection[] = [
  { label: 'Overview', to: '/overview' },
  { label: 'Portfolios', to: '/portfolios' },
  { label: 'Sites', to: '/sites' },
  { label: 'Runs', to: '/runs' },
  { label: 'Assumptions', to: '/assumptions' },
  // Every member reads terms and each run's financial view (README "Insurance terms"); underwriters and admins edit terms.
  { label: 'Insurance', to: '/insurance' },
  { label: 'Capital plan', to: '/capital-plan', roles: ['admin', 'analyst', 'asset_manager', 'underwriter', 'viewer'] },
  { label: 'Calibration', to: '/calibration', roles: [...EDITOR_ROLES] },
  // After the storm: reports for every role but viewers (the readers: asset managers, underwriters, analysts, admins).
  { label: 'Storms', to: '/storms', roles: ['admin', 'analyst', 'underwriter', 'asset_manager'] },
  // Referrals raised on sites: every member reads them (underwriters raise them, anyone may be given one).
  { label: 'Referrals', to: '/referrals' },
  { label: 'Admin', to: '/admin', roles: ['admin'] },
]

export function sectionsForRole(role: RoleName | null | undefined): NavSection[] {
  if (!role) return []
  return navSections.filter(s => !s.roles || s.roles.includes(role))
}
