import { boolean, index, integer, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { timestamps } from './columns'

export const organisationKind = pgEnum('organisation_kind', ['insurer', 'broker', 'operator', 'consultancy'])
export const memberRole = pgEnum('member_role', ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer'])

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
  ...timestamps,
}, t => [uniqueIndex('users_email_unique').on(t.email)])

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
