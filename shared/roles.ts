// The five roles and four kinds of organisation, with the words people read (PRODUCT.md "Users and roles").
import type { RoleName } from './navigation'

export const ROLE_NAMES: RoleName[] = ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer']

export const roleLabels: Record<RoleName, string> = {
  admin: 'Admin',
  analyst: 'Analyst',
  underwriter: 'Underwriter',
  asset_manager: 'Asset manager',
  viewer: 'Viewer',
}

/** What each role may do, shown beside the role pickers. */
export const roleDescriptions: Record<RoleName, string> = {
  admin: 'Everything in the organisation, including members, invitations and roles.',
  analyst: 'Edits portfolios, sites, tanks and assumption sets; uploads data; starts and cancels runs.',
  underwriter: 'Reads everything; compares sites; writes referral notes; exports.',
  asset_manager: 'Reads everything; builds capital plans and mitigation scenarios; exports.',
  viewer: 'Reads only.',
}

export type OrganisationKindName = 'insurer' | 'broker' | 'operator' | 'consultancy'

export const organisationKindLabels: Record<OrganisationKindName, string> = {
  insurer: 'Insurer',
  broker: 'Broker',
  operator: 'Operator',
  consultancy: 'Consultancy',
}
