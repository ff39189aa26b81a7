// The five roles and four kinds of organisation, with the words people read (PRODUCT.md "Users and roles").
// The one list of roles: the database enum (server/db/schema/accounts.ts), the guard's role groups
// (ROLES in server/utils/auth.ts), the zod schemas and the pickers all read ROLE_NAMES.

export const ROLE_NAMES = ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer'] as const
export type RoleName = (typeof ROLE_NAMES)[number]

/** Admins and analysts: they change the inventory, assumptions and calibrations and start runs. */
export const EDITOR_ROLES = ['admin', 'analyst'] as const satisfies readonly RoleName[]

/** Whether a role (or none) is one of `roles`. */
export function roleIn(roles: readonly RoleName[], role: string | null | undefined): boolean {
  return (roles as readonly string[]).includes(role ?? '')
}

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
