// The one authorisation guard every API route calls first.
import { and, eq } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { useDb } from '../db'
import { memberships, organisations, users, type Role } from '../db/schema'

export interface Member {
  user: { id: string, email: string, name: string }
  organisationId: string
  organisationName: string
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
 * Returns the caller's user, organisation and role, or throws 401 (no valid session) or 403 (the
 * role may not do this). The membership is read from the database on every call, so a removed
 * member or a changed role takes effect at once, and a password reset ends older sessions.
 */
export async function requireMembership(event: H3Event, options: { roles?: readonly Role[] } = {}): Promise<Member> {
  const session = await getUserSession(event)
  if (!session.user?.id || !session.organisationId) {
    throw createError({ statusCode: 401, statusMessage: 'Sign in to continue.' })
  }
  const [row] = await useDb()
    .select({ role: memberships.role, sessionVersion: users.sessionVersion, disabled: users.disabled, email: users.email, name: users.name, organisationName: organisations.name, currency: organisations.currency })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .innerJoin(organisations, eq(organisations.id, memberships.organisationId))
    .where(and(eq(memberships.userId, session.user.id), eq(memberships.organisationId, session.organisationId)))
  if (!row || row.disabled || row.sessionVersion !== session.sessionVersion) {
    await clearUserSession(event)
    throw createError({ statusCode: 401, statusMessage: 'Your session has ended. Sign in again.' })
  }
  const allowed = options.roles ?? ROLES.everyone
  if (!allowed.includes(row.role)) {
    throw createError({ statusCode: 403, statusMessage: 'Your role in this organisation does not allow this.' })
  }
  return {
    user: { id: session.user.id, email: row.email, name: row.name },
    organisationId: session.organisationId,
    organisationName: row.organisationName,
    currency: row.currency,
    role: row.role,
  }
}
