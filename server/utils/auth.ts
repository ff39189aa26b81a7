// The one authorisation guard every API route calls first.
import { and, asc, eq } from 'drizzle-orm'
import type { H3Event } from 'h3'
import type { UserSession } from '#auth-utils'
import { useDb } from '../db'
import { memberships, organisations, users, type OrganisationKind, type Role } from '../db/schema'

export interface Member {
  user: { id: string, email: string, name: string }
  organisationId: string
  organisationName: string
  organisationKind: OrganisationKind
  currency: string
  role: Role
}

/** Role groups used across routes (PRODUCT.md "Users and roles"). */
export const ROLES = {
  everyone: ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer'],
  editors: ['admin', 'analyst'],
  admins: ['admin'],
  planners: ['admin', 'asset_manager'],
  exporters: ['admin', 'analyst', 'underwriter', 'asset_manager'],
  underwriting: ['admin', 'underwriter'],
} as const satisfies Record<string, readonly Role[]>

/**
 * The member a session stands for, read from the database; null when the session no longer holds
 * (membership removed, account disabled, or the password was reset or changed since it began).
 */
export async function memberOfSession(session: UserSession): Promise<Member | null> {
  if (!session.user?.id || !session.organisationId) return null
  const [row] = await useDb()
    .select({ role: memberships.role, sessionVersion: users.sessionVersion, disabled: users.disabled, email: users.email, name: users.name, organisationName: organisations.name, organisationKind: organisations.kind, currency: organisations.currency })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .innerJoin(organisations, eq(organisations.id, memberships.organisationId))
    .where(and(eq(memberships.userId, session.user.id), eq(memberships.organisationId, session.organisationId)))
  if (!row || row.disabled || row.sessionVersion !== session.sessionVersion) return null
  return {
    user: { id: session.user.id, email: row.email, name: row.name },
    organisationId: session.organisationId,
    organisationName: row.organisationName,
    organisationKind: row.organisationKind,
    currency: row.currency,
    role: row.role,
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

/** Starts (or replaces) the session of a person in one of their organisations. */
export async function startMemberSession(event: H3Event, user: { id: string, email: string, name: string, sessionVersion: number }, membership: { organisationId: string, role: Role }) {
  await replaceUserSession(event, {
    user: { id: user.id, email: user.email, name: user.name },
    organisationId: membership.organisationId,
    role: membership.role,
    sessionVersion: user.sessionVersion,
    loggedInAt: Date.now(),
  })
}
