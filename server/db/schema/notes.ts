import { date, index, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { REFERRAL_STATUSES } from '../../../shared/schemas/notes'
import { organisations, users } from './accounts'
import { sites } from './inventory'

/** Where a referral stands: open → in review → accepted or declined. */
export const referralStatus = pgEnum('referral_status', REFERRAL_STATUSES)

/**
 * Referral notes an underwriter writes on a site, with author and time; each is a referral with a
 * status, an assignee in the organisation, a due date and a thread of replies.
 */
export const siteNotes = pgTable('site_notes', {
  id: uuid('id').primaryKey().defaultRandom(),
  /** The organisation whose people wrote the note (the site may be shared with it). */
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  siteId: uuid('site_id').notNull().references(() => sites.id, { onDelete: 'cascade' }),
  authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
  body: text('body').notNull(),
  status: referralStatus('status').notNull().default('open'),
  /** The member who is to act on it (a member of `organisationId`). */
  assigneeId: uuid('assignee_id').references(() => users.id, { onDelete: 'set null' }),
  /** The day it is due (a calendar date, no time). */
  dueOn: date('due_on', { mode: 'string' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  /** Last change of status, assignee, due date or a reply. */
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  index('site_notes_site_idx').on(t.siteId, t.createdAt),
  index('site_notes_org_idx').on(t.organisationId),
  index('site_notes_author_idx').on(t.authorId),
  index('site_notes_assignee_idx').on(t.assigneeId),
  index('site_notes_org_status_idx').on(t.organisationId, t.status),
])

/** The thread of a referral: replies in order, with author and time. */
export const siteNoteReplies = pgTable('site_note_replies', {
  id: uuid('id').primaryKey().defaultRandom(),
  noteId: uuid('note_id').notNull().references(() => siteNotes.id, { onDelete: 'cascade' }),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
  body: text('body').notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  index('site_note_replies_note_idx').on(t.noteId, t.createdAt),
  index('site_note_replies_org_idx').on(t.organisationId),
  index('site_note_replies_author_idx').on(t.authorId),
])
