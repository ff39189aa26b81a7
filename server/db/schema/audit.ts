import { index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { organisations, users } from './accounts'

/** Append-only record of who changed what, when, with the before and after state. */
export const auditEvents = pgTable('audit_events', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').references(() => organisations.id, { onDelete: 'cascade' }),
  userId: uuid('user_id').references(() => users.id, { onDelete: 'set null' }),
  /** e.g. 'sign_in', 'create', 'update', 'delete', 'export'. */
  action: text('action').notNull(),
  /** e.g. 'site', 'tank', 'membership'. */
  entity: text('entity').notNull(),
  entityId: text('entity_id'),
  before: jsonb('before'),
  after: jsonb('after'),
  ipAddress: text('ip_address'),
  /** Set when the change was made with an API token: 'token <name>'; null for a session. */
  via: text('via'),
  at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  index('audit_org_at_idx').on(t.organisationId, t.at),
  index('audit_user_idx').on(t.userId),
  index('audit_entity_idx').on(t.entity, t.entityId),
])
