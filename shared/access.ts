// Which pages are open to everyone and which sections a role may open (used by the page middleware).
// This shapes what people see; the server checks every request on its own (requireMembership).
import { navSections, type RoleName } from './navigation'

// The what-if computes in the browser from its own inputs and the gallery shows invented figures: no data of anyone's.
const PUBLIC_PATHS = ['/', '/sign-in', '/methodology', '/what-if', '/preview/results']
const PUBLIC_PREFIXES = ['/reset-password', '/invitations/', '/methodology/']

export function isPublicPath(path: string): boolean {
  return PUBLIC_PATHS.includes(path) || PUBLIC_PREFIXES.some(p => path === p || path.startsWith(p.endsWith('/') ? p : `${p}/`))
}

/** False when the path belongs to a section the role does not see (e.g. /admin for an analyst). */
export function roleMaySee(path: string, role: RoleName | null | undefined): boolean {
  const section = navSections.find(s => path === s.to || path.startsWith(`${s.to}/`))
  return !section?.roles || (role ? section.roles.includes(role) : false)
}

/** Only paths inside this app are followed after sign-in (no open redirect). */
export function safeNext(next: unknown): string {
  return typeof next === 'string' && next.startsWith('/') && !next.startsWith('//') && !next.startsWith('/\\') ? next : '/overview'
}
