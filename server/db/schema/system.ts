import { index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'

/** Small facts about this installation, e.g. when the demo scenario was seeded. */
export const appState = pgTable('app_state', {
  key: text('key').primaryKey(),
  value: jsonb('value').notNull(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
})

/**
 * The last sign of life of each job being worked (run chunks, scenario sites): the worker beats
 * every few seconds while it works the job; a job that is still active in the queue but whose beat
 * is stale had its worker die, and is handed on at once (server/jobs/heartbeat.ts) instead of
 * waiting for the queue's expiry.
 */
export const jobHeartbeats = pgTable('job_heartbeats', {
  jobId: uuid('job_id').primaryKey(),
  queue: text('queue').notNull(),
  /** host:pid of the worker process. */
  worker: text('worker').notNull(),
  beatAt: timestamp('beat_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [index('job_heartbeats_beat_at_idx').on(t.beatAt)])
