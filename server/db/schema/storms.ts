// After the storm (PRODUCT.md §15): lightning-location feeds per organisation, the batches they
// (or uploads) brought, every flash record once, storm windows grouping them in time, each tank's
// probabilities per window, and the alerts that went out.
import { sql } from 'drizzle-orm'
import { check, doublePrecision, index, integer, jsonb, numeric, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { organisations, users } from './accounts'
import { timestamps } from './columns'
import { sites, tanks } from './inventory'
import { assumptionSetVersions } from './runs'

/** Expected money figures: numeric with cents, read as numbers. */
const money = (name: string) => numeric(name, { precision: 20, scale: 2, mode: 'number' })

export const stormBatchSource = pgEnum('storm_batch_source', ['feed', 'upload'])
export const stormBatchState = pgEnum('storm_batch_state', ['queued', 'processed', 'failed'])
export const stormRecordType = pgEnum('storm_record_type', ['ground', 'cloud'])
export const stormWindowState = pgEnum('storm_window_state', ['pending', 'computed'])

/** A provider's feed into one organisation. Only the SHA-256 of its bearer token is kept. */
export const stormFeeds = pgTable('storm_feeds', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  tokenHash: text('token_hash').notNull(),
  /** The token's last four characters, so people can tell feeds apart. */
  tokenHint: text('token_hint').notNull(),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  revokedAt: timestamp('revoked_at', { withTimezone: true }),
  ...timestamps,
}, t => [
  uniqueIndex('storm_feeds_token_hash_unique').on(t.tokenHash),
  index('storm_feeds_org_idx').on(t.organisationId),
  index('storm_feeds_created_by_idx').on(t.createdBy),
  check('storm_feeds_name_present', sql`length(${t.name}) > 0`),
])

/**
 * Every post to the feed endpoint under a feed's token — stored, duplicate or refused alike — so the
 * rate limit counts attempts, not stored batches (server/storms/feed-auth.ts). Rows older than ten
 * minutes are pruned as new attempts arrive.
 */
export const stormFeedAttempts = pgTable('storm_feed_attempts', {
  id: uuid('id').primaryKey().defaultRandom(),
  feedId: uuid('feed_id').notNull().references(() => stormFeeds.id, { onDelete: 'cascade' }),
  attemptedAt: timestamp('attempted_at', { withTimezone: true, precision: 3 }).notNull().defaultNow(),
}, t => [
  index('storm_feed_attempts_feed_at_idx').on(t.feedId, t.attemptedAt),
])

/** One posted batch or uploaded file; the same content posted again is the same batch. */
export const stormBatches = pgTable('storm_batches', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  feedId: uuid('feed_id').references(() => stormFeeds.id, { onDelete: 'set null' }),
  source: stormBatchSource('source').notNull(),
  fileName: text('file_name').notNull().default(''),
  sha256: text('sha256').notNull(),
  recordCount: integer('record_count').notNull(),
  /** Records not already known from an earlier batch. */
  newRecords: integer('new_records').notNull(),
  state: stormBatchState('state').notNull().default('queued'),
  error: text('error'),
  processedAt: timestamp('processed_at', { withTimezone: true }),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  uniqueIndex('storm_batches_org_sha_unique').on(t.organisationId, t.sha256),
  index('storm_batches_org_created_idx').on(t.organisationId, t.createdAt),
  index('storm_batches_feed_idx').on(t.feedId),
  index('storm_batches_created_by_idx').on(t.createdBy),
  check('storm_batches_counts', sql`${t.recordCount} >= 0 AND ${t.newRecords} >= 0 AND ${t.newRecords} <= ${t.recordCount}`),
])

/** A storm window: flashes of one organisation no more than the gap apart in time. */
export const stormWindows = pgTable('storm_windows', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  startsAt: timestamp('starts_at', { withTimezone: true, precision: 3 }).notNull(),
  endsAt: timestamp('ends_at', { withTimezone: true, precision: 3 }).notNull(),
  flashCount: integer('flash_count').notNull().default(0),
  state: stormWindowState('state').notNull().default('pending'),
  /** The assumption-set version the probabilities came from (the organisation's newest at computing time). */
  assumptionVersionId: uuid('assumption_version_id').references(() => assumptionSetVersions.id, { onDelete: 'set null' }),
  engineVersion: text('engine_version'),
  computedAt: timestamp('computed_at', { withTimezone: true }),
  /** Σ over tanks of P(ignition): the expected number of tanks set alight by the window's flashes. */
  expectedFires: doublePrecision('expected_fires').notNull().default(0),
  expectedGroundUpLoss: money('expected_ground_up_loss').notNull().default(0),
  /** Counts and settings behind the figures (flashes near sites, quadrature, gap). */
  summary: jsonb('summary').notNull().default({}),
  ...timestamps,
}, t => [
  index('storm_windows_org_starts_idx').on(t.organisationId, t.startsAt),
  index('storm_windows_assumption_version_idx').on(t.assumptionVersionId),
  check('storm_windows_order', sql`${t.startsAt} <= ${t.endsAt}`),
])

/** Every flash record once per organisation, whatever batch brought it (unique on its content). */
export const stormFlashes = pgTable('storm_flashes', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  /** SHA-256 of the record's time, position, current and type: the provider's record identity. */
  recordKey: text('record_key').notNull(),
  batchId: uuid('batch_id').references(() => stormBatches.id, { onDelete: 'set null' }),
  windowId: uuid('window_id').references(() => stormWindows.id, { onDelete: 'set null' }),
  occurredAt: timestamp('occurred_at', { withTimezone: true, precision: 3 }).notNull(),
  latDeg: doublePrecision('lat_deg').notNull(),
  lonDeg: doublePrecision('lon_deg').notNull(),
  /** Signed, kA (negative polarity < 0). */
  peakCurrentKa: doublePrecision('peak_current_ka').notNull(),
  type: stormRecordType('type').notNull(),
  /** σ per axis of the circular Gaussian location error, km (null: not stated). */
  locationErrorKm: doublePrecision('location_error_km'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  uniqueIndex('storm_flashes_org_record_unique').on(t.organisationId, t.recordKey),
  index('storm_flashes_org_time_idx').on(t.organisationId, t.occurredAt),
  index('storm_flashes_window_idx').on(t.windowId),
  index('storm_flashes_batch_idx').on(t.batchId),
])

/** Per window and tank: the flashes combined (P of at least one) and the flash that drives the ignition. */
export const stormTankResults = pgTable('storm_tank_results', {
  windowId: uuid('window_id').notNull().references(() => stormWindows.id, { onDelete: 'cascade' }),
  tankId: uuid('tank_id').notNull().references(() => tanks.id, { onDelete: 'cascade' }),
  siteId: uuid('site_id').notNull().references(() => sites.id, { onDelete: 'cascade' }),
  direct: doublePrecision('direct').notNull(),
  sparking: doublePrecision('sparking').notNull(),
  ignition: doublePrecision('ignition').notNull(),
  drivingFlashId: uuid('driving_flash_id').references(() => stormFlashes.id, { onDelete: 'set null' }),
  drivingIgnition: doublePrecision('driving_ignition').notNull(),
  /** Expected loss of a fire starting at the tank (spread included), as property damage and interruption. */
  fireLossPropertyDamage: money('fire_loss_property_damage').notNull(),
  fireLossInterruption: money('fire_loss_interruption').notNull(),
}, t => [
  primaryKey({ columns: [t.windowId, t.tankId] }),
  index('storm_tank_results_window_ignition_idx').on(t.windowId, t.ignition),
  index('storm_tank_results_tank_idx').on(t.tankId),
  index('storm_tank_results_site_idx').on(t.siteId),
  index('storm_tank_results_flash_idx').on(t.drivingFlashId),
  check('storm_tank_results_probabilities', sql`${t.direct} BETWEEN 0 AND 1 AND ${t.sparking} BETWEEN 0 AND 1 AND ${t.ignition} BETWEEN 0 AND 1`),
])

/**
 * Per window and site the flashes reached: what the site brings to the storm's loss (shared/storms/loss.ts
 * `StormSiteLossModel`: the tanks that can burn with their P(fire) and values, the spread between them,
 * the damage ratios, the value at risk), so each reader's current terms apply to it when the report is
 * read. Windows computed before this table have no rows; their report says so.
 */
export const stormSiteResults = pgTable('storm_site_results', {
  windowId: uuid('window_id').notNull().references(() => stormWindows.id, { onDelete: 'cascade' }),
  siteId: uuid('site_id').notNull().references(() => sites.id, { onDelete: 'cascade' }),
  lossModel: jsonb('loss_model').notNull(),
  /** E[Σ loss of the burning tanks], spread included. */
  expectedGroundUpLoss: money('expected_ground_up_loss').notNull(),
}, t => [
  primaryKey({ columns: [t.windowId, t.siteId] }),
  index('storm_site_results_site_idx').on(t.siteId),
])

/** The organisation's alert rule: e-mail the subscribers when a tank's ignition probability passes it. */
export const stormAlertSettings = pgTable('storm_alert_settings', {
  organisationId: uuid('organisation_id').primaryKey().references(() => organisations.id, { onDelete: 'cascade' }),
  ignitionThreshold: doublePrecision('ignition_threshold').notNull(),
  updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  index('storm_alert_settings_updated_by_idx').on(t.updatedBy),
  check('storm_alert_settings_threshold_range', sql`${t.ignitionThreshold} > 0 AND ${t.ignitionThreshold} <= 1`),
])

/** People who asked for storm alerts in an organisation. */
export const stormAlertSubscribers = pgTable('storm_alert_subscribers', {
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  primaryKey({ columns: [t.organisationId, t.userId] }),
  index('storm_alert_subscribers_user_idx').on(t.userId),
])

/** An alert that went out: which tanks passed the threshold in which window, and to whom. */
export const stormAlerts = pgTable('storm_alerts', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  windowId: uuid('window_id').notNull().references(() => stormWindows.id, { onDelete: 'cascade' }),
  ignitionThreshold: doublePrecision('ignition_threshold').notNull(),
  /** [{ tankId, tag, siteName, ignition }] */
  tanks: jsonb('tanks').notNull(),
  recipients: jsonb('recipients').notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  index('storm_alerts_org_created_idx').on(t.organisationId, t.createdAt),
  index('storm_alerts_window_idx').on(t.windowId),
])
