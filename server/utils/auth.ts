// The one authorisation guard every API route calls first.
import { and, asc, eq, gt, isNull } from 'drizzle-orm'
import type { H3Event } from 'h3'
import type { UserSession } from '#auth-utils'
import { useDb } from '../db'
import { memberships, organisations, userSessions, users, type OrganisationKind, type Role } from '../db/schema'
import { EDITOR_ROLES, ROLE_NAMES } from '../../shared/roles'
import { openSessionRecord, revokeSession, sessionStartCutoff, touchSession } from '../accounts/sessions'
import { bearerToken, memberOfToken } from '../accounts/api-tokens'

export interface Member {
  user: { id: string, email: string, name: string }
  organisationId: string
  organisationName: string
  organisationKind: OrganisationKind
  currency: string
  role: Role
  /** The user_sessions row of the request's session; null for a request made with an API token. */
  sessionId: string | null
  /** The API token the request was made with (README "Scripted access"); null for a session. */
  token: { id: string, name: string, readOnly: boolean } | null
}

/**
 * Routes an API token never opens, whatever its role: sign-in, password, profile and session routes
 * (everything under /api/auth/, which includes one's own tokens, /api/auth/tokens) and the
 * organisation's token list (/api/tokens). A token that could make tokens or change the password
 * would outlive its own revocation.
 */
export const TOKEN_REFUSED_PATHS = ['/api/auth/', '/api/tokens'] as const

export function tokenRefusedOn(path: string): boolean {
  const p = path.split('?')[0]!
  return TOKEN_REFUSED_PATHS.some(prefix => prefix.endsWith('/') ? p.startsWith(prefix) : p === prefix || p.startsWith(`${prefix}/`))
}

/** Methods a read-only token may use. */
const READ_METHODS = new Set(['GET', 'HEAD'])

/** Role groups used across routes (PRODUCT.md "Users and roles"). */
export const ROLES = {
  everyone: ROLE_NAMES,
  editors: EDITOR_ROLES,
  admins: ['admin'],
  planners: ['admin', 'asset_manager'],
  exporters: ['admin', 'analyst', 'underwriter', 'asset_manager'],
  /** Every member but viewers: save what-if options, reply in referral threads (and act on referrals given to them). */
  contributors: ['admin', 'analyst', 'underwriter', 'asset_manager'],
  underwriting: ['admin', 'underwriter'],
} as const satisfies Record<string, readonly Role[]>

/**
 * The member a session stands for, read from the database in one query; null when the session no
 * longer holds: its record was revoked (sign-out, sign out everywhere) or is older than the session
 * lifetime, the membership was removed, the account disabled, or the password was reset or changed
 * since it began.
 */
export async function memberOfSession(session: UserSession): Promise<Member | null> {
  if (!session.user?.id || !session.organisationId || !session.sessionId) return null
  const [row] = await useDb()
    .select({ role: memberships.role, sessionVersion: users.sessionVersion, disabled: users.disabled, email: users.email, name: users.name, organisationName: organisations.name, organisationKind: organisations.kind, currency: organisations.currency, lastSeenAt: userSessions.lastSeenAt })
    .from(userSessions)
    .innerJoin(users, eq(users.id, userSessions.userId))
    .innerJoin(memberships, and(eq(memberships.userId, users.id), eq(memberships.organisationId, session.organisationId)))
    .innerJoin(organisations, eq(organisations.id, memberships.organisationId))
    .where(and(eq(userSessions.id, session.sessionId), eq(userSessions.userId, session.user.id), isNull(userSessions.revokedAt), gt(userSessions.createdAt, sessionStartCutoff())))
  if (!row || row.disabled || row.sessionVersion !== session.sessionVersion) return null
  await touchSession(session.sessionId, row.lastSeenAt)
  return {
    user: { id: session.user.id, email: row.email, name: row.name },
    organisationId: session.organisationId,
    organisationName: row.organisationName,
    organisationKind: row.organisationKind,
    currency: row.currency,
    role: row.role,
    sessionId: session.sessionId,
    token: null,
  }
}

/**
 * The member an API token stands for (no session cookie, `Authorization: Bearer slk_…`): 401 for an
 * unknown, revoked or expired token or one whose owner left, was disabled or changed password; 403
 * on the routes tokens never open and for a read-only token on anything but GET/HEAD. The request is
 * marked (`event.context.apiToken`) so recordAudit writes `via: 'token <name>'`.
 */
async function memberOfBearer(event: H3Event, secret: string): Promise<Member> {
  if (tokenRefusedOn(event.path)) {
    throw createError({ statusCode: 403, statusMessage: 'API tokens do not open sign-in, password, session or token routes. Sign in to use this.' })
  }
  const t = await memberOfToken(event, secret)
  if (t.readOnly && !READ_METHODS.has(event.method)) {
    throw createError({ statusCode: 403, statusMessage: 'This token is read-only.' })
  }
  event.context.apiToken = { id: t.tokenId, name: t.tokenName }
  return {
    user: t.user,
    organisationId: t.organisationId,
    organisationName: t.organisationName,
    organisationKind: t.organisationKind,
    currency: t.currency,
    role: t.role,
    sessionId: null,
    token: { id: t.tokenId, name: t.tokenName, readOnly: t.readOnly },
  }
}

/**
 * Returns the caller's user, organisation and role, or throws 401 (no valid session or token) or
 * 403 (the role may not do this). The membership is read from the database on every call, so a
 * removed member or a changed role takes effect at once, and a password reset ends older sessions
 * (and API tokens). A request with a session cookie is the session's; one without a session and
 * with `Authorization: Bearer` is the API token's (memberOfBearer).
 */
export async function requireMembership(event: H3Event, options: { roles?: readonly Role[] } = {}): Promise<Member> {
  const session = await getUserSession(event)
  let member: Member | null
  if (session.user?.id && session.organisationId) {
    member = await memberOfSession(session)
    if (!member) {
      await clearUserSession(event)
      throw createError({ statusCode: 401, statusMessage: 'Your session has ended. Sign in again.' })
    }
  } else {
    const secret = bearerToken(event)
    if (secret === null) throw createError({ statusCode: 401, statusMessage: 'Sign in to continue.' })
    member = await memberOfBearer(event, secret)
  }
  const allowed = options.roles ?? ROLES.everyone
  if (!allowed.includes(member.role)) {
    throw createError({ statusCode: 403, statusMessage: 'Your role in this organisation does not allow this.' })
  }
  return member
}

/** Every organisation the person belongs to, with their role in each, in the order they joined. */
export async function membershipsOf(userId: string) {
  return useDb()
    .select({ organisationId: memberships.organisationId, organisationName: organisations.name, kind: organisations.kind, role: memberships.role })
    .from(memberships)
    .innerJoin(organisations, eq(organisations.id, memberships.organisationId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(memberships.createdAt), asc(organisations.name))
}

/**
 * Seals the session cookie of a person in one of their organisations. Without `sessionId` a new
 * session record is opened (a sign-in) and the browser's previous session, if any, is revoked;
 * with it, the same session carries on (switching organisation, after a password change).
 */
export async function startMemberSession(event: H3Event, user: { id: string, email: string, name: string, sessionVersion: number }, membership: { organisationId: string, role: Role }, sessionId?: string) {
  let id = sessionId
  if (!id) {
    const previous = (await getUserSession(event)).sessionId
    if (previous) await revokeSession(previous)
    id = await openSessionRecord(event, user.id)
  }
  await replaceUserSession(event, {
    user: { id: user.id, email: user.email, name: user.name },
    organisationId: membership.organisationId,
    role: membership.role,
    sessionVersion: user.sessionVersion,
    sessionId: id,
    loggedInAt: Date.now(),
  })
}

declare module 'h3' {
  interface H3EventContext {
    /** Set by requireMembership on a request made with an API token; recordAudit reads it. */
    apiToken?: { id: string, name: string }
  }
}
