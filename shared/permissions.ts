// What each role may do, in one table the screens ask ("may this role do X?"). It mirrors the role
// groups the routes check (ROLES in server/utils/auth.ts) and the role table in README.md; the server
// decides every request on its own, this only shapes what a page offers.
import { EDITOR_ROLES, ROLE_NAMES, type RoleName } from './roles'

const EVERYONE: readonly RoleName[] = ROLE_NAMES
const EDITORS: readonly RoleName[] = EDITOR_ROLES

export const PERMISSIONS = {
  /** Workbooks and spreadsheets: every role but viewer (ROLES.exporters). */
  export: ['admin', 'analyst', 'underwriter', 'asset_manager'],
  /** Portfolios, sites, tanks, structures, imports (ROLES.editors). */
  editInventory: EDITORS,
  /** Assumption sets and their versions (ROLES.editors). */
  editAssumptions: EDITORS,
  /** Start, cancel and retry runs (ROLES.editors). */
  startRuns: EDITORS,
  /** Calibrations: upload records, save calibrated versions (ROLES.editors). */
  calibrate: EDITORS,
  /** Capital plan: costs, candidate actions, saved plans (ROLES.planners). */
  plan: ['admin', 'asset_manager'],
  /** Tank what-if: keep options on the server for the organisation (ROLES.contributors). */
  saveWhatIf: ['admin', 'analyst', 'underwriter', 'asset_manager'],
  /** Capital plan: evaluating actions runs simulations, so it is an analyst's task (ROLES.editors). */
  evaluateActions: EDITORS,
  /** Insurance terms and referrals: write them, give them to someone, set due dates (ROLES.underwriting). */
  underwrite: ['admin', 'underwriter'],
  /** Reply in a referral's thread, and move the status of one given to you (ROLES.contributors). */
  reply: ['admin', 'analyst', 'underwriter', 'asset_manager'],
  /** Members, invitations, audit log, mailbox (ROLES.admins). */
  administer: ['admin'],
  /** Reading anything of the organisation. */
  read: EVERYONE,
} as const satisfies Record<string, readonly RoleName[]>

export type Permission = keyof typeof PERMISSIONS

/** True when the role may do the thing; false for no role (signed out). */
export function roleMay(role: RoleName | null | undefined, permission: Permission): boolean {
  return !!role && (PERMISSIONS[permission] as readonly RoleName[]).includes(role)
}

/** The roles that may do the thing, in words: "admins and analysts". */
export function whoMay(permission: Permission): string {
  const plural: Record<RoleName, string> = { admin: 'admins', analyst: 'analysts', underwriter: 'underwriters', asset_manager: 'asset managers', viewer: 'viewers' }
  const names = (PERMISSIONS[permission] as readonly RoleName[]).map(r => plural[r])
  return names.length < 2 ? (names[0] ?? '') : `${names.slice(0, -1).join(', ')} and ${names.at(-1)}`
}
