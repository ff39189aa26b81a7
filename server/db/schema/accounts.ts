import { type AnyPgColumn, boolean, index, integer, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { timestamps } from './columns'
import { ROLE_NAMES } from '../../../shared/roles'

export const organisationKind = pgEnum('organisation_kind', ['insurer', 'broker', 'operator', 'consultancy'])
export const memberRole = pgEnum('member_role', ROLE_NAMES)

export const organisations = pgTable('organisations', {
  id: uuid('id').primaryKey().defaultRandom(),
  name: text('name').notNull(),
  kind: organisationKind('kind').notNull(),
  /** ISO 4217 code; every money figure of the organisation is in this currency. */
  currency: text('currency').notNull().default('USD'),
  ...timestamps,
})

export const users = pgTable('users', {
  id: uuid('id').primaryKey().defaultRandom(),
  email: text('email').notNull(),
  name: text('name').notNull(),
  passwordHash: text('password_hash'),
  /** Bumped on password reset: sessions carrying an older value are refused. */
  sessionVersion: integer('session_version').notNull().default(1),
  disabled: boolean('disabled').notNull().default(false),
  lastSignInAt: timestamp('last_sign_in_at', { withTimezone: true }),
  /** The organisation the person worked in last; sign-in starts there. */
  lastOrganisationId: uuid('last_organisation_id').references((): AnyPgColumn => organisations.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [uniqueIndex('users_email_unique').on(t.email), index('users_last_organisation_idx').on(t.lastOrganisationId)])

export const memberships = pgTable('memberships', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  role: memberRole('role').notNull(),
  ...timestamps,
}, t => [
  uniqueIndex('memberships_org_user_unique').on(t.organisationId, t.userId),
  index('memberships_user_idx').on(t.userId),
])

export type Role = (typeof memberRole.enumValues)[number]
export type OrganisationKind = (typeof organisationKind.enumValues)[number]

/**
 * An invitation to join an organisation with a role. Only the SHA-256 of the e-mailed token is
 * stored, so a copy of the database cannot be used to accept invitations.
 */
export const invitations = pgTable('invitations', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  email: text('email').notNull(),
  role: memberRole('role').notNull(),
  tokenHash: text('token_hash').notNull(),
  invitedById: uuid('invited_by_id').references(() => users.id, { onDelete: 'set null' }),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  acceptedAt: timestamp('accepted_at', { withTimezone: true }),
  acceptedById: uuid('accepted_by_id').references(() => users.id, { onDelete: 'set null' }),
  revokedAt: timestamp('revoked_at', { withTimezone: true }),
  ...timestamps,
}, t => [
  uniqueIndex('invitations_token_hash_unique').on(t.tokenHash),
  index('invitations_org_idx').on(t.organisationId, t.createdAt),
  index('invitations_email_idx').on(t.email),
  index('invitations_invited_by_idx').on(t.invitedById),
  index('invitations_accepted_by_idx').on(t.acceptedById),
])

/** A single-use password-reset token (its SHA-256), valid for one hour. */
export const passwordResetTokens = pgTable('password_reset_tokens', {
  id: uuid('id').primaryKey().defaultRandom(),
  userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  tokenHash: text('token_hash').notNull(),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  usedAt: timestamp('used_at', { withTimezone: true }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  uniqueIndex('password_reset_tokens_hash_unique').on(t.tokenHash),
  index('password_reset_tokens_user_idx').on(t.userId, t.createdAt),
])

/**
 * Every sign-in attempt, for throttling: failures are counted per e-mail address and per client
 * address over a sliding window. Kept in PostgreSQL so every server process sees the same counts.
 */
export const signInAttempts = pgTable('sign_in_attempts', {
  id: uuid('id').primaryKey().defaultRandom(),
  email: text('email').notNull(),
  ipAddress: text('ip_address').notNull(),
  succeeded: boolean('succeeded').notNull(),
  at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  index('sign_in_attempts_email_idx').on(t.email, t.at),
  index('sign_in_attempts_ip_idx').on(t.ipAddress, t.at),
])

/**
 * A signed-in session. The sealed cookie carries only this row's id (with the user and
 * organisation); every request checks that the row exists, belongs to the user and is not revoked,
 * so signing out (or out everywhere) ends the cookie at once, wherever it was copied.
 */
export const userSessions = pgTable('user_sessions', {
  id: uuid('id').primaryKey().defaultRandom(),
  userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  /** Updated at most once a minute, so the per-request check stays a read. */
  lastSeenAt: timestamp('last_seen_at', { withTimezone: true }).notNull().defaultNow(),
  revokedAt: timestamp('revoked_at', { withTimezone: true }),
  /** What the person sees in their list of sessions (browser, address); shortened, never trusted. */
  userAgent: text('user_agent').notNull().default(''),
  ipAddress: text('ip_address').notNull().default(''),
}, t => [index('user_sessions_user_idx').on(t.userId, t.createdAt)])

/**
 * A personal API token: acts as its owner with the owner's role in one organisation. Only the
 * SHA-256 of the secret is stored (with its last 4 characters, for display); a token stops working
 * when revoked, past its expiry, when the membership goes, the account is disabled, or the owner's
 * password is reset or changed (its session version then no longer matches).
 */
export const apiTokens = pgTable('api_tokens', {
  id: uuid('id').primaryKey().defaultRandom(),
  userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  tokenHash: text('token_hash').notNull(),
  /** The secret's last 4 characters, so a person can tell their tokens apart. */
  lastFour: text('last_four').notNull(),
  readOnly: boolean('read_only').notNull().default(false),
  /** The owner's session_version when the token was made. */
  sessionVersion: integer('session_version').notNull(),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  revokedAt: timestamp('revoked_at', { withTimezone: true }),
  revokedById: uuid('revoked_by_id').references(() => users.id, { onDelete: 'set null' }),
  /** Updated at most once a minute per token, so most requests only read. */
  lastUsedAt: timestamp('last_used_at', { withTimezone: true }),
  lastUsedAddress: text('last_used_address'),
}, t => [
  uniqueIndex('api_tokens_hash_unique').on(t.tokenHash),
  index('api_tokens_user_idx').on(t.userId, t.createdAt),
  index('api_tokens_org_idx').on(t.organisationId, t.createdAt),
])
