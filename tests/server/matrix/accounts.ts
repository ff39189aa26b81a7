// Role matrix rules for accounts, sign-in and health (see types.ts for what each rule asserts).
import { randomBytes, createHash } from 'node:crypto'
import type pg from 'pg'
import { createMember, insertApiToken } from '../../support/accounts'
import type { MatrixModule, RoleName, RouteRule } from './types'

const ADMINS: RoleName[] = ['admin']
const EVERYONE: RoleName[] = ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer']

export const rules: RouteRule[] = [
  { method: 'GET', file: 'server/api/health.get.ts', path: '/api/health', allowed: 'public' },

  // Sign-in and password reset by e-mail are open to anyone; the reset and invitation links carry
  // their own credential (the token), so they have no organisation to probe across.
  { method: 'POST', file: 'server/api/auth/sign-in.post.ts', path: '/api/auth/sign-in', allowed: 'public' },
  { method: 'POST', file: 'server/api/auth/reset-password/index.post.ts', path: '/api/auth/reset-password', allowed: 'public' },
  { method: 'GET', file: 'server/api/auth/reset-password/[token].get.ts', path: '/api/auth/reset-password/[token]', allowed: 'public' },
  { method: 'POST', file: 'server/api/auth/reset-password/[token].post.ts', path: '/api/auth/reset-password/[token]', allowed: 'public' },
  { method: 'GET', file: 'server/api/invitations/accept/[token].get.ts', path: '/api/invitations/accept/[token]', allowed: 'public' },
  { method: 'POST', file: 'server/api/invitations/accept/[token].post.ts', path: '/api/invitations/accept/[token]', allowed: 'public' },

  // One's own session and account: every member.
  { method: 'POST', file: 'server/api/auth/sign-out.post.ts', path: '/api/auth/sign-out', allowed: EVERYONE },
  { method: 'POST', file: 'server/api/auth/switch-organisation.post.ts', path: '/api/auth/switch-organisation', allowed: EVERYONE },
  { method: 'POST', file: 'server/api/auth/change-password.post.ts', path: '/api/auth/change-password', allowed: EVERYONE },
  { method: 'PATCH', file: 'server/api/auth/profile.patch.ts', path: '/api/auth/profile', allowed: EVERYONE },
  // One's own sessions and one's own mail (they take no id: only ever the caller's own rows).
  { method: 'GET', file: 'server/api/auth/sessions/index.get.ts', path: '/api/auth/sessions', allowed: EVERYONE },
  { method: 'POST', file: 'server/api/auth/sessions/sign-out-everywhere.post.ts', path: '/api/auth/sessions/sign-out-everywhere', allowed: EVERYONE },
  { method: 'GET', file: 'server/api/my-mail/index.get.ts', path: '/api/my-mail', allowed: EVERYONE },
  // One's own API tokens: every member, only ever their own (another person's token answers 404).
  { method: 'GET', file: 'server/api/auth/tokens/index.get.ts', path: '/api/auth/tokens', allowed: EVERYONE },
  { method: 'POST', file: 'server/api/auth/tokens/index.post.ts', path: '/api/auth/tokens', allowed: EVERYONE },
  { method: 'DELETE', file: 'server/api/auth/tokens/[id].delete.ts', path: '/api/auth/tokens/[id]', allowed: EVERYONE, params: { id: 'apiTokenId' } },

  // The organisation's people: admins only.
  { method: 'GET', file: 'server/api/members/index.get.ts', path: '/api/members', allowed: ADMINS },
  { method: 'PATCH', file: 'server/api/members/[id].patch.ts', path: '/api/members/[id]', allowed: ADMINS, params: { id: 'membershipId' }, body: { role: 'analyst' } },
  { method: 'DELETE', file: 'server/api/members/[id].delete.ts', path: '/api/members/[id]', allowed: ADMINS, params: { id: 'membershipId' } },
  { method: 'GET', file: 'server/api/invitations/index.get.ts', path: '/api/invitations', allowed: ADMINS },
  { method: 'POST', file: 'server/api/invitations/index.post.ts', path: '/api/invitations', allowed: ADMINS },
  { method: 'DELETE', file: 'server/api/invitations/[id].delete.ts', path: '/api/invitations/[id]', allowed: ADMINS, params: { id: 'invitationId' } },
  { method: 'POST', file: 'server/api/invitations/[id]/resend.post.ts', path: '/api/invitations/[id]/resend', allowed: ADMINS, params: { id: 'invitationId' } },
  { method: 'GET', file: 'server/api/audit/index.get.ts', path: '/api/audit', allowed: ADMINS },
  { method: 'GET', file: 'server/api/audit/export.get.ts', path: '/api/audit/export', allowed: ADMINS },
  { method: 'GET', file: 'server/api/mailbox/index.get.ts', path: '/api/mailbox', allowed: ADMINS },
  { method: 'GET', file: 'server/api/tokens/index.get.ts', path: '/api/tokens', allowed: ADMINS },
  { method: 'DELETE', file: 'server/api/tokens/[id].delete.ts', path: '/api/tokens/[id]', allowed: ADMINS, params: { id: 'apiTokenId' } },
]

/** A member (viewer) with an API token and an open invitation in the organisation, for the cross-organisation probes. */
export async function fixtures(pool: pg.Pool, organisationId: string): Promise<Record<string, string>> {
  const { membershipId, userId } = await createMember(pool, organisationId, 'viewer')
  const tokenHash = createHash('sha256').update(randomBytes(32).toString('base64url')).digest('hex')
  const invitation = await pool.query(
    `INSERT INTO invitations (organisation_id, email, role, token_hash, expires_at) VALUES ($1, $2, 'analyst', $3, now() + interval '7 days') RETURNING id`,
    [organisationId, `invitee.${randomBytes(4).toString('hex')}@example.test`, tokenHash],
  )
  const apiToken = await insertApiToken(pool, userId, organisationId, { name: 'matrix fixture token' })
  return { membershipId, invitationId: invitation.rows[0].id, apiTokenId: apiToken.id }
}

export default { rules, fixtures } satisfies MatrixModule
