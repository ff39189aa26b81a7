import { index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { organisations, users } from './accounts'
import { sites } from './inventory'

/** Referral notes an underwriter writes on a site; append-only, with author and time. */
export const siteNotes = pgTable('site_notes', {
  id: uuid('id').primaryKey().defaultRandom(),
  /** The organisation whose people wrote the note (the site may be shared with it). */
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  siteId: uuid('site_id').notNull().references(() => sites.id, { onDelete: 'cascade' }),
  authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
  body: text('body').notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  index('site_notes_site_idx').on(t.siteId, t.createdAt),
  index('site_notes_org_idx').on(t.organisationId),
  index('site_notes_author_idx').on(t.authorId),
])
