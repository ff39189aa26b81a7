import { bigint, boolean, customType, doublePrecision, index, integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { organisations, users } from './accounts'
import { timestamps } from './columns'
import { moneyColumn, resultFigureColumns, resultStandardErrorColumns } from './figures'
import { sql } from 'drizzle-orm'
import type { ChunkTiming } from '../../runs/timing'
import type { StoredYearSummary } from '../../results/queries'
import type { SiteFacts } from '../../runs/snapshot'
import type { SiteInput } from '../../../shared/engine/types'
import type { ClusteringFrame } from '../../../shared/engine/storm-clusters'
import type { StoredPortfolioDraws, StoredSiteDraws, StoredTankDraws } from '../../../shared/results/draws'

const bytea = customType<{ data: Buffer, driverData: Buffer }>({ dataType: () => 'bytea' })

export const runMode = pgEnum('run_mode', ['frequency', 'year'])
export const runState = pgEnum('run_state', ['queued', 'running', 'succeeded', 'failed', 'cancelled'])
export const chunkState = pgEnum('run_chunk_state', ['pending', 'done'])

/** A named family of assumption versions. */
export const assumptionSets = pgTable('assumption_sets', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  description: text('description').notNull().default(''),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  /** Archived: hidden from lists and pickers by default, kept for what used it (null: in use). */
  archivedAt: timestamp('archived_at', { withTimezone: true }),
  archivedBy: uuid('archived_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  uniqueIndex('assumption_sets_org_name_unique').on(t.organisationId, t.name),
  index('assumption_sets_org_archived_idx').on(t.organisationId, t.archivedAt),
  index('assumption_sets_archived_by_idx').on(t.archivedBy),
])

/** One version of an assumption set: the full, validated engine parameters. Frozen once a run used it. */
export const assumptionSetVersions = pgTable('assumption_set_versions', {
  id: uuid('id').primaryKey().defaultRandom(),
  assumptionSetId: uuid('assumption_set_id').notNull().references(() => assumptionSets.id, { onDelete: 'cascade' }),
  version: integer('version').notNull(),
  /** The engine's AssumptionSet (shared/engine/assumptions.ts), complete and validated. */
  parameters: jsonb('parameters').notNull(),
  note: text('note').notNull().default(''),
  /** Where changed values came from (e.g. a calibration), shown beside them. */
  provenance: jsonb('provenance').notNull().default({}),
  usedByRun: boolean('used_by_run').notNull().default(false),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [uniqueIndex('assumption_versions_set_version_unique').on(t.assumptionSetId, t.version)])

export const runs = pgTable('runs', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  /** No foreign key: a run stays readable (from its snapshot) after its portfolio is deleted. */
  portfolioId: uuid('portfolio_id').notNull(),
  portfolioName: text('portfolio_name').notNull(),
  /** What people call the run; set at start from the portfolio and the UTC date, editable by editors. */
  name: text('name').notNull().default(''),
  /** The portfolio's reference run: the one the overview opens (at most one per portfolio, index below). */
  isReference: boolean('is_reference').notNull().default(false),
  assumptionVersionId: uuid('assumption_version_id').notNull().references(() => assumptionSetVersions.id, { onDelete: 'restrict' }),
  mode: runMode('mode').notNull(),
  seed: bigint('seed', { mode: 'number' }).notNull(),
  /** Frequency mode: stop a tank at this relative standard error. */
  targetRse: doublePrecision('target_rse').notNull(),
  maxSamplesPerTank: integer('max_samples_per_tank').notNull(),
  /** Frequency mode: the negligible-rate rule (/yr); a sampled figure whose upper bound is below it stops, reported as that bound. 0: off. */
  negligibleRatePerYear: doublePrecision('negligible_rate_per_year').notNull().default(1e-5),
  /** Year mode: simulated years per site. */
  years: integer('years').notNull(),
  /** Year mode: storm clustering (shared/engine/storm-clusters.ts) — flashes arrive in storms shared by nearby sites. Off for runs before the option. */
  stormClustering: boolean('storm_clustering').notNull().default(false),
  /**
   * With storm clustering: the run's plane (reference point of the projection) and λmax, the largest
   * Ng of its sites (flashes/km²/yr), fixed at start so every chunk sees the same storms. Null when off.
   */
  clusteringFrame: jsonb('clustering_frame').$type<ClusteringFrame>(),
  /** Assumption uncertainty: K draws of the uncertain assumptions (0: no draws; runs before the option had none). */
  assumptionDraws: integer('assumption_draws').notNull().default(0),
  chunkSize: integer('chunk_size').notNull(),
  state: runState('state').notNull().default('queued'),
  sitesTotal: integer('sites_total').notNull(),
  sitesDone: integer('sites_done').notNull().default(0),
  tanksTotal: integer('tanks_total').notNull(),
  chunksTotal: integer('chunks_total').notNull(),
  chunksDone: integer('chunks_done').notNull().default(0),
  /** sha-256 of engine version, assumptions, mode, seed, targets and the site snapshot. */
  inputHash: text('input_hash').notNull(),
  engineVersion: text('engine_version').notNull(),
  errorMessage: text('error_message'),
  requestedBy: uuid('requested_by').references(() => users.id, { onDelete: 'set null' }),
  /** Run this one repeats (retry), if any. */
  retryOf: uuid('retry_of'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  startedAt: timestamp('started_at', { withTimezone: true }),
  finishedAt: timestamp('finished_at', { withTimezone: true }),
}, t => [
  index('runs_org_created_idx').on(t.organisationId, t.createdAt),
  index('runs_portfolio_idx').on(t.portfolioId),
  index('runs_state_idx').on(t.state),
  index('runs_assumption_version_idx').on(t.assumptionVersionId),
  uniqueIndex('runs_one_reference_per_portfolio').on(t.organisationId, t.portfolioId).where(sql`${t.isReference}`),
])

/** The inventory exactly as the run saw it: one row per site (engine SiteInput plus display facts). */
export const runSiteSnapshots = pgTable('run_site_snapshots', {
  runId: uuid('run_id').notNull().references(() => runs.id, { onDelete: 'cascade' }),
  siteId: uuid('site_id').notNull(),
  position: integer('position').notNull(),
  site: jsonb('site').$type<SiteInput>().notNull(),
  facts: jsonb('facts').$type<SiteFacts>().notNull(),
}, t => [primaryKey({ columns: [t.runId, t.siteId] }), index('run_site_snapshots_position_idx').on(t.runId, t.position)])

export const runChunks = pgTable('run_chunks', {
  runId: uuid('run_id').notNull().references(() => runs.id, { onDelete: 'cascade' }),
  chunkIndex: integer('chunk_index').notNull(),
  siteIds: jsonb('site_ids').$type<string[]>().notNull(),
  state: chunkState('state').notNull().default('pending'),
  attempts: integer('attempts').notNull().default(0),
  worker: text('worker'),
  completedAt: timestamp('completed_at', { withTimezone: true }),
  /** Where the stored attempt's time went (server/runs/timing.ts); {} for chunks worked before it was measured. */
  timing: jsonb('timing').$type<ChunkTiming | Record<string, never>>(),
}, t => [primaryKey({ columns: [t.runId, t.chunkIndex] })])

/**
 * Expected annual loss split into property damage (replacement + contents + clean-up) and business
 * interruption, organisation currency per year. Null for runs of engine 1, which kept the total only.
 */
const lossSplitColumns = () => ({
  expectedAnnualLossPd: moneyColumn('expected_annual_loss_pd'),
  expectedAnnualLossBi: moneyColumn('expected_annual_loss_bi'),
})

export const runTankResults = pgTable('run_tank_results', {
  runId: uuid('run_id').notNull().references(() => runs.id, { onDelete: 'cascade' }),
  siteId: uuid('site_id').notNull(),
  tankId: uuid('tank_id').notNull(),
  tag: text('tag').notNull(),
  // The figures (server/db/schema/figures.ts): rates, intervals, simulated counts; tanks keep no standard errors.
  ...resultFigureColumns(),
  ...lossSplitColumns(),
  /** Figures stopped by the negligible-rate rule ('sparking', 'ignition', 'expectedAnnualLoss'): their hi is an upper bound, lo is 0. */
  upperBoundFigures: text('upper_bound_figures').array().notNull().default(sql`'{}'::text[]`),
  samples: bigint('samples', { mode: 'number' }).notNull(),
  drivingComponentClass: text('driving_component_class'),
  converged: boolean('converged').notNull(),
  /** Runs with assumption draws: the 5/50/95 % points of the four figures across draws; null: no draws. */
  draws: jsonb('draws').$type<StoredTankDraws>(),
}, t => [
  primaryKey({ columns: [t.runId, t.tankId] }),
  index('run_tank_results_site_idx').on(t.runId, t.siteId),
  index('run_tank_results_ignition_idx').on(t.runId, t.ignitionRate),
])

export const runSiteResults = pgTable('run_site_results', {
  runId: uuid('run_id').notNull().references(() => runs.id, { onDelete: 'cascade' }),
  siteId: uuid('site_id').notNull(),
  /** R of MODEL.md §1 and λ on that disc (flashes/yr). */
  radiusM: doublePrecision('radius_m').notNull(),
  lambdaPerYear: doublePrecision('lambda_per_year').notNull(),
  // The figures (server/db/schema/figures.ts): rates, intervals, simulated counts, standard errors.
  ...resultFigureColumns(),
  ...resultStandardErrorColumns(),
  ...lossSplitColumns(),
  samples: bigint('samples', { mode: 'number' }).notNull(),
  /** Year mode: the site's summary (AAL, return-period losses, TVaR) and its loss events (packed). */
  yearSummary: jsonb('year_summary').$type<StoredYearSummary>(),
  events: bytea('events'),
  /** Share of events by current band × distance band (site heatmap). */
  eventBands: jsonb('event_bands'),
  /** Runs with assumption draws: bands, sensitivity indices and the per-evaluation figures the portfolio adds; null: no draws. */
  draws: jsonb('draws').$type<StoredSiteDraws>(),
}, t => [
  primaryKey({ columns: [t.runId, t.siteId] }),
  index('run_site_results_ignition_idx').on(t.runId, t.ignitionRate),
])

export const runPortfolioResults = pgTable('run_portfolio_results', {
  runId: uuid('run_id').primaryKey().references(() => runs.id, { onDelete: 'cascade' }),
  // The figures (server/db/schema/figures.ts): rates, intervals, simulated counts, standard errors.
  ...resultFigureColumns(),
  ...resultStandardErrorColumns(),
  ...lossSplitColumns(),
  /** Year mode: AAL, aggregate/occurrence losses at 10…1000 years, TVaR and the curves. */
  yearSummary: jsonb('year_summary').$type<StoredYearSummary>(),
  /** Runs with assumption draws: the portfolio's bands and sensitivity indices; null: no draws. */
  draws: jsonb('draws').$type<StoredPortfolioDraws>(),
  computedAt: timestamp('computed_at', { withTimezone: true }).notNull().defaultNow(),
})


/**
 * The result views' answers of a succeeded run (dashboard, site list), serialised once and kept:
 * results never change, so every web process and every restart reads the stored JSON instead of
 * rebuilding it (server/results/documents.ts). `version` names the engine of the run and the format
 * of the view; a document of another version is rebuilt on its next read. Runs finished before this
 * table existed get theirs on first read.
 */
export const runResultDocuments = pgTable('run_result_documents', {
  runId: uuid('run_id').notNull().references(() => runs.id, { onDelete: 'cascade' }),
  /** 'dashboard' | 'sites'. */
  view: text('view').notNull(),
  currency: text('currency').notNull(),
  version: text('version').notNull(),
  body: text('body').notNull(),
  builtAt: timestamp('built_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [primaryKey({ columns: [t.runId, t.view, t.currency] })])
