import { index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { organisations } from './accounts'

/** Messages captured by the local SMTP fake (development, tests, demo). Real SMTP leaves this empty. */
export const capturedMail = pgTable('captured_mail', {
  id: uuid('id').primaryKey().defaultRandom(),
  /**
   * The organisation that sent the message (invitations, run notices); null for mail that belongs to
   * a person alone (password reset, password changed). Only the sender's admins see it in the Mailbox.
   */
  organisationId: uuid('organisation_id').references(() => organisations.id, { onDelete: 'cascade' }),
  fromAddress: text('from_address').notNull(),
  toAddresses: text('to_addresses').notNull(),
  subject: text('subject').notNull(),
  textBody: text('text_body').notNull(),
  raw: text('raw').notNull(),
  receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [index('captured_mail_received_idx').on(t.receivedAt), index('captured_mail_to_idx').on(t.toAddresses), index('captured_mail_org_idx').on(t.organisationId, t.receivedAt)])
