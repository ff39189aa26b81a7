// The one authorisation guard every API route calls first.
import { and, asc, eq, gt, isNull } from 'drizzle-orm'
import type { H3Event } from 'h3'
import type { UserSession } from '#auth-utils'
import { useDb } from '../db'
import { memberships, organisations, userSessions, users, type OrganisationKind, type Role } from '../db/schema'
import { EDITOR_ROLES, ROLE_NAMES } from '../../shared/roles'
import { openSessionRecord, revokeSession, sessionStartCutoff, touchSession } from '../accounts/sessions'

export interface Member {
  user: { id: string, email: string, name: string }
  organisationId: string
  organisationName: string
  organisationKind: OrganisationKind
  currency: string
  role: Role
  /** The user_sessions row of the request's session. */
  sessionId: string
}

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
  }
}

/**
 * Returns the caller's user, organisation and role, or throws 401 (no valid session) or 403 (the
 * role may not do this). The membership is read from the database on every call, so a removed
 * member or a changed role takes effect at once, and a password reset ends older sessions.
 */
export async function requireMembership(event: H3Event, options: { roles?: readonly Role[] } = {}): Promise<Member> {
  const session = await getUserSession(event)
  if (!session.user?.id || !session.organisationId) {
    throw createError({ statusCode: 401, statusMessage: 'Sign in to continue.' })
  }
  const member = await memberOfSession(session)
  if (!member) {
    await clearUserSession(event)
    throw createError({ statusCode: 401, statusMessage: 'Your session has ended. Sign in again.' })
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
