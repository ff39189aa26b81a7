import { jsonb, pgTable, text, timestamp } from 'drizzle-orm/pg-core'

/** Small facts about this installation, e.g. when the demo scenario was seeded. */
export const appState = pgTable('app_state', {
  key: text('key').primaryKey(),
  value: jsonb('value').notNull(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
})
