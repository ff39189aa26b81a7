// Insurance terms: a portfolio's policy terms, versioned like assumption sets. A version holds one
// row of terms per site (per-occurrence deductible and limit, annual aggregate deductible and limit,
// the insurer's share); it is frozen once a run has recorded it, and editing it then makes the next
// version. Money in the organisation's currency (numeric, 2 decimals); null limits mean unlimited.
import { sql } from 'drizzle-orm'
import { boolean, check, index, integer, numeric, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { organisations, users } from './accounts'
import { timestamps } from './columns'
import { MONEY_NUMERIC } from '../../../shared/schemas/money'
import { runs } from './runs'

const money = (name: string) => numeric(name, { ...MONEY_NUMERIC.insurance, mode: 'number' })

/** One terms set per organisation and portfolio (the portfolio may be one shared with the organisation). */
export const policyTermsSets = pgTable('policy_terms_sets', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  /** No foreign key, like runs: the terms a run used stay readable after the portfolio is deleted. */
  portfolioId: uuid('portfolio_id').notNull(),
  name: text('name').notNull(),
  description: text('description').notNull().default(''),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  /** Archived: hidden from lists and pickers by default, kept for what used it (null: in use). */
  archivedAt: timestamp('archived_at', { withTimezone: true }),
  archivedBy: uuid('archived_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  uniqueIndex('policy_terms_sets_org_portfolio_unique').on(t.organisationId, t.portfolioId),
  index('policy_terms_sets_org_archived_idx').on(t.organisationId, t.archivedAt),
  index('policy_terms_sets_archived_by_idx').on(t.archivedBy),
  index('policy_terms_sets_portfolio_idx').on(t.portfolioId),
])

export const policyTermsVersions = pgTable('policy_terms_versions', {
  id: uuid('id').primaryKey().defaultRandom(),
  termsSetId: uuid('terms_set_id').notNull().references(() => policyTermsSets.id, { onDelete: 'cascade' }),
  version: integer('version').notNull(),
  note: text('note').notNull().default(''),
  usedByRun: boolean('used_by_run').notNull().default(false),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [uniqueIndex('policy_terms_versions_set_version_unique').on(t.termsSetId, t.version)])

export const policySiteTerms = pgTable('policy_site_terms', {
  versionId: uuid('version_id').notNull().references(() => policyTermsVersions.id, { onDelete: 'cascade' }),
  /** No foreign key: a frozen version keeps its rows when a site is deleted from the inventory. */
  siteId: uuid('site_id').notNull(),
  occurrenceDeductible: money('occurrence_deductible').notNull().default(0),
  occurrenceLimit: money('occurrence_limit'),
  aggregateDeductible: money('aggregate_deductible').notNull().default(0),
  aggregateLimit: money('aggregate_limit'),
  /**
   * Business-interruption waiting period as a money deductible on each occurrence's interruption
   * part (a waiting period of D days is entered as D × the daily interruption value).
   */
  interruptionDeductible: money('interruption_deductible').notNull().default(0),
  /** The insurer's share, 0–1. */
  share: numeric('share', { precision: 7, scale: 6, mode: 'number' }).notNull().default(1),
}, t => [
  primaryKey({ columns: [t.versionId, t.siteId] }),
  index('policy_site_terms_site_idx').on(t.siteId),
  check('policy_site_terms_deductibles_nonnegative', sql`${t.occurrenceDeductible} >= 0 AND ${t.aggregateDeductible} >= 0`),
  check('policy_site_terms_interruption_deductible_nonnegative', sql`${t.interruptionDeductible} >= 0`),
  check('policy_site_terms_limits_positive', sql`coalesce(${t.occurrenceLimit}, 1) > 0 AND coalesce(${t.aggregateLimit}, 1) > 0`),
  check('policy_site_terms_share_range', sql`${t.share} BETWEEN 0 AND 1`),
])

export const policyLayerKind = pgEnum('policy_layer_kind', ['occurrence', 'aggregate'])

/**
 * Layers on the portfolio's insured loss (after every site's terms and share), several per terms
 * version: per-occurrence excess of loss (each event) or annual aggregate (each year's total).
 * The layer pays min(limit, max(0, loss − attachment)); a null limit means unlimited.
 */
export const policyLayers = pgTable('policy_layers', {
  id: uuid('id').primaryKey().defaultRandom(),
  versionId: uuid('version_id').notNull().references(() => policyTermsVersions.id, { onDelete: 'cascade' }),
  position: integer('position').notNull(),
  name: text('name').notNull(),
  kind: policyLayerKind('kind').notNull(),
  attachment: money('attachment').notNull(),
  limit: money('limit'),
}, t => [
  uniqueIndex('policy_layers_version_position_unique').on(t.versionId, t.position),
  check('policy_layers_attachment_nonnegative', sql`${t.attachment} >= 0`),
  check('policy_layers_limit_positive', sql`coalesce(${t.limit}, 1) > 0`),
])

/** The terms version a run recorded at its start (none when the portfolio had no terms then). */
export const runTerms = pgTable('run_terms', {
  runId: uuid('run_id').primaryKey().references(() => runs.id, { onDelete: 'cascade' }),
  termsVersionId: uuid('terms_version_id').notNull().references(() => policyTermsVersions.id, { onDelete: 'no action' }),
}, t => [index('run_terms_version_idx').on(t.termsVersionId)])
