// Personal API tokens (README "Scripted access"): `slk_` + 32 random bytes, URL-safe. Only the
// SHA-256 of the secret is stored, with its last 4 characters for display; the secret is answered
// once, when the token is made. A token acts as its owner with the owner's role, read from the
// database on every request, in the one organisation it was made for.
import { randomBytes } from 'node:crypto'
import { and, desc, eq, gt, isNull } from 'drizzle-orm'
import { getRequestHeader, type H3Event } from 'h3'
import { useDb } from '../db'
import { apiTokens, memberships, organisations, users, type OrganisationKind, type Role } from '../db/schema'
import { hashToken } from './tokens'
import { clientAddress } from '../utils/client-address'
import { recordAudit } from '../utils/audit'
import { fail, notFound } from '../utils/errors'

export const API_TOKEN_PREFIX = 'slk_'
/** last_used_at is written at most this often per token, so most requests only read. */
const LAST_USED_RESOLUTION_MS = 60 * 1000

export function newApiTokenSecret(): { secret: string, tokenHash: string, lastFour: string } {
  const secret = API_TOKEN_PREFIX + randomBytes(32).toString('base64url')
  return { secret, tokenHash: hashToken(secret), lastFour: secret.slice(-4) }
}

/** The bearer token of a request, or null when it sends none. */
export function bearerToken(event: H3Event): string | null {
  const header = getRequestHeader(event, 'authorization')
  if (!header) return null
  const match = /^Bearer\s+(\S+)\s*$/i.exec(header)
  return match ? match[1]! : ''
}

export interface TokenMember {
  tokenId: string
  tokenName: string
  readOnly: boolean
  user: { id: string, email: string, name: string }
  organisationId: string
  organisationName: string
  organisationKind: OrganisationKind
  currency: string
  role: Role
}

/**
 * The member a bearer token stands for, or throws 401 with what went wrong: unknown, revoked,
 * expired, or no longer valid because the membership, the account or the password changed.
 */
export async function memberOfToken(event: H3Event, secret: string): Promise<TokenMember> {
  if (!secret.startsWith(API_TOKEN_PREFIX)) fail(401, `Send an API token (it starts with "${API_TOKEN_PREFIX}") as "Authorization: Bearer <token>".`)
  const db = useDb()
  const [row] = await db
    .select({
      id: apiTokens.id, name: apiTokens.name, readOnly: apiTokens.readOnly, expiresAt: apiTokens.expiresAt, revokedAt: apiTokens.revokedAt,
      tokenVersion: apiTokens.sessionVersion, lastUsedAt: apiTokens.lastUsedAt, lastUsedAddress: apiTokens.lastUsedAddress,
      userId: users.id, email: users.email, userName: users.name, disabled: users.disabled, sessionVersion: users.sessionVersion,
      organisationId: apiTokens.organisationId, role: memberships.role,
      organisationName: organisations.name, organisationKind: organisations.kind, currency: organisations.currency,
    })
    .from(apiTokens)
    .innerJoin(users, eq(users.id, apiTokens.userId))
    .innerJoin(organisations, eq(organisations.id, apiTokens.organisationId))
    .leftJoin(memberships, and(eq(memberships.userId, apiTokens.userId), eq(memberships.organisationId, apiTokens.organisationId)))
    .where(eq(apiTokens.tokenHash, hashToken(secret)))
  if (!row) fail(401, 'This API token is not known.')
  if (row.revokedAt) fail(401, 'This API token was revoked.')
  if (row.expiresAt.getTime() <= Date.now()) fail(401, `This API token expired on ${row.expiresAt.toISOString().slice(0, 10)}.`)
  if (row.disabled || !row.role) fail(401, 'This API token\'s owner no longer belongs to its organisation.')
  if (row.sessionVersion !== row.tokenVersion) fail(401, 'This API token ended when its owner\'s password was changed or reset. Make a new one.')
  const address = clientAddress(event).slice(0, 64)
  if (!row.lastUsedAt || Date.now() - row.lastUsedAt.getTime() >= LAST_USED_RESOLUTION_MS || row.lastUsedAddress !== address) {
    await db.update(apiTokens).set({ lastUsedAt: new Date(), lastUsedAddress: address }).where(eq(apiTokens.id, row.id))
  }
  return {
    tokenId: row.id,
    tokenName: row.name,
    readOnly: row.readOnly,
    user: { id: row.userId, email: row.email, name: row.userName },
    organisationId: row.organisationId,
    organisationName: row.organisationName,
    organisationKind: row.organisationKind,
    currency: row.currency,
    role: row.role,
  }
}

const listed = {
  id: apiTokens.id,
  name: apiTokens.name,
  lastFour: apiTokens.lastFour,
  readOnly: apiTokens.readOnly,
  organisationId: apiTokens.organisationId,
  organisationName: organisations.name,
  createdAt: apiTokens.createdAt,
  expiresAt: apiTokens.expiresAt,
  lastUsedAt: apiTokens.lastUsedAt,
  lastUsedAddress: apiTokens.lastUsedAddress,
  ownerName: users.name,
  ownerEmail: users.email,
}

/** Tokens still open (not revoked, not expired): the person's own across organisations, or an organisation's. */
export async function listApiTokens(filter: { userId: string } | { organisationId: string }) {
  const owner = 'userId' in filter ? eq(apiTokens.userId, filter.userId) : eq(apiTokens.organisationId, filter.organisationId)
  const rows = await useDb().select(listed).from(apiTokens)
    .innerJoin(organisations, eq(organisations.id, apiTokens.organisationId))
    .innerJoin(users, eq(users.id, apiTokens.userId))
    .where(and(owner, isNull(apiTokens.revokedAt), gt(apiTokens.expiresAt, new Date())))
    .orderBy(desc(apiTokens.createdAt))
    .limit(200)
  return rows.map(r => ({ ...r, display: `${API_TOKEN_PREFIX}…${r.lastFour}` }))
}

export async function createApiToken(event: H3Event, owner: { userId: string, organisationId: string }, input: { name: string, expiresOn: string, readOnly: boolean }) {
  const db = useDb()
  const [membership] = await db.select({ role: memberships.role, sessionVersion: users.sessionVersion })
    .from(memberships).innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.userId, owner.userId), eq(memberships.organisationId, owner.organisationId)))
  if (!membership) fail(400, 'You do not belong to that organisation.', { organisationId: 'You do not belong to that organisation.' })
  const { secret, tokenHash, lastFour } = newApiTokenSecret()
  const expiresAt = new Date(`${input.expiresOn}T23:59:59.999Z`)
  const row = await db.transaction(async (tx) => {
    const [created] = await tx.insert(apiTokens).values({
      userId: owner.userId, organisationId: owner.organisationId, name: input.name, tokenHash, lastFour,
      readOnly: input.readOnly, sessionVersion: membership.sessionVersion, expiresAt,
    }).returning({ id: apiTokens.id, createdAt: apiTokens.createdAt })
    await recordAudit({
      organisationId: owner.organisationId, userId: owner.userId, action: 'create', entity: 'api_token', entityId: created!.id,
      after: { name: input.name, readOnly: input.readOnly, expiresAt: expiresAt.toISOString(), role: membership.role, display: `${API_TOKEN_PREFIX}…${lastFour}` },
    }, { tx, event })
    return created!
  })
  return { id: row.id, secret, name: input.name, readOnly: input.readOnly, expiresAt, createdAt: row.createdAt, display: `${API_TOKEN_PREFIX}…${lastFour}` }
}

/** Revokes an open token of the owner (`userId`) or of the organisation (`organisationId`, admins); another's answers 404. */
export async function revokeApiToken(event: H3Event, actor: { userId: string }, id: string, scope: { userId: string } | { organisationId: string }) {
  const db = useDb()
  const owned = 'userId' in scope ? eq(apiTokens.userId, scope.userId) : eq(apiTokens.organisationId, scope.organisationId)
  return await db.transaction(async (tx) => {
    const [row] = await tx.update(apiTokens).set({ revokedAt: new Date(), revokedById: actor.userId })
      .where(and(eq(apiTokens.id, id), owned, isNull(apiTokens.revokedAt)))
      .returning({ id: apiTokens.id, name: apiTokens.name, organisationId: apiTokens.organisationId, userId: apiTokens.userId, lastFour: apiTokens.lastFour })
    if (!row) notFound('API token')
    await recordAudit({
      organisationId: row.organisationId, userId: actor.userId, action: 'revoke', entity: 'api_token', entityId: row.id,
      before: { name: row.name, ownerId: row.userId, display: `${API_TOKEN_PREFIX}…${row.lastFour}` }, after: { revoked: true },
    }, { tx, event })
    return { ok: true, id: row.id }
  })
}
