// Capital planning: the organisation's mitigation catalogue, candidate actions on tanks and sites,
// scenario evaluations (baseline and actions on common random numbers) and saved plans.
import { sql } from 'drizzle-orm'
import { check, doublePrecision, index, integer, jsonb, numeric, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { organisations, users } from './accounts'
import { timestamps } from './columns'
import { MONEY_NUMERIC } from '../../../shared/schemas/money'
import { componentClass, sites, tanks } from './inventory'
import { assumptionSetVersions } from './runs'

/** Money with cents, read as numbers. */
const money = (name: string) => numeric(name, { ...MONEY_NUMERIC.capital, mode: 'number' })

export const mitigationKind = pgEnum('mitigation_kind', ['shield', 'remove_class', 'steel_tank', 'vapour_control', 'mast', 'grounding', 'static_dissipator'])
export const costBasis = pgEnum('cost_basis', ['each', 'diameter_m', 'height_m', 'component_count', 'volume_m3'])
export const capitalEvaluationState = pgEnum('capital_evaluation_state', ['queued', 'running', 'succeeded', 'failed'])
export const planMetric = pgEnum('plan_metric', ['loss', 'ignition'])

/** One option of the organisation's catalogue: its effect in the model and its cost rule. */
export const mitigationOptions = pgTable('mitigation_options', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  kind: mitigationKind('kind').notNull(),
  name: text('name').notNull(),
  shieldRatingKa: doublePrecision('shield_rating_ka'),
  componentClass: componentClass('component_class'),
  mastHeightM: doublePrecision('mast_height_m'),
  mastRadiusM: doublePrecision('mast_radius_m'),
  fixedCost: money('fixed_cost').notNull().default(0),
  rate: money('rate').notNull().default(0),
  costBasis: costBasis('cost_basis').notNull().default('each'),
  /** Costs are rounded up to whole steps (money), so plans are optimised exactly over whole steps. */
  costStep: money('cost_step').notNull().default(100),
  /** Archived: hidden from lists and pickers by default, kept for what used it (null: in use). */
  archivedAt: timestamp('archived_at', { withTimezone: true }),
  archivedBy: uuid('archived_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  uniqueIndex('mitigation_options_org_name_unique').on(t.organisationId, t.name),
  index('mitigation_options_org_archived_idx').on(t.organisationId, t.archivedAt),
  index('mitigation_options_archived_by_idx').on(t.archivedBy),
  check('mitigation_options_costs_nonnegative', sql`${t.fixedCost} >= 0 AND ${t.rate} >= 0 AND ${t.costStep} > 0`),
  check('mitigation_options_shield_rating', sql`${t.shieldRatingKa} IS NULL OR ${t.shieldRatingKa} > 0`),
  check('mitigation_options_mast', sql`${t.mastHeightM} IS NULL OR ${t.mastHeightM} > 0`),
])

/** A proposed action: an option on a tank (or a mast on a site) with its cost. */
export const capitalActions = pgTable('capital_actions', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  optionId: uuid('option_id').notNull().references(() => mitigationOptions.id, { onDelete: 'cascade' }),
  siteId: uuid('site_id').notNull().references(() => sites.id, { onDelete: 'cascade' }),
  tankId: uuid('tank_id').references(() => tanks.id, { onDelete: 'cascade' }),
  mastXM: doublePrecision('mast_x_m'),
  mastYM: doublePrecision('mast_y_m'),
  cost: money('cost').notNull(),
  note: text('note').notNull().default(''),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  index('capital_actions_org_idx').on(t.organisationId),
  index('capital_actions_site_idx').on(t.siteId),
  index('capital_actions_option_idx').on(t.optionId),
  // One action per option and tank (bulk add skips tanks that already have it).
  uniqueIndex('capital_actions_option_tank_unique').on(t.optionId, t.tankId),
  check('capital_actions_cost_nonnegative', sql`${t.cost} >= 0`),
])

/** A scenario evaluation: baseline and scenarios worked site by site on common random numbers. */
export const capitalEvaluations = pgTable('capital_evaluations', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  assumptionVersionId: uuid('assumption_version_id').notNull().references(() => assumptionSetVersions.id, { onDelete: 'restrict' }),
  /** The plan whose per-site bundles this evaluation measured (null: every single action). */
  planId: uuid('plan_id'),
  seed: integer('seed').notNull(),
  samplesPerTank: integer('samples_per_tank').notNull(),
  state: capitalEvaluationState('state').notNull().default('queued'),
  sitesTotal: integer('sites_total').notNull(),
  sitesDone: integer('sites_done').notNull().default(0),
  error: text('error'),
  requestedBy: uuid('requested_by').references(() => users.id, { onDelete: 'set null' }),
  finishedAt: timestamp('finished_at', { withTimezone: true }),
  ...timestamps,
}, t => [
  index('capital_evaluations_org_idx').on(t.organisationId, t.createdAt),
  index('capital_evaluations_version_idx').on(t.assumptionVersionId),
  index('capital_evaluations_plan_idx').on(t.planId),
])

/** The frozen baseline site and the scenarios to measure on it; the worker's unit of work. */
export const capitalEvaluationSites = pgTable('capital_evaluation_sites', {
  evaluationId: uuid('evaluation_id').notNull().references(() => capitalEvaluations.id, { onDelete: 'cascade' }),
  siteId: uuid('site_id').notNull(),
  siteName: text('site_name').notNull(),
  /** Engine SiteInput of the baseline. */
  site: jsonb('site').notNull(),
  /** [{ key, actionIds, actions: ActionEffect[] }] */
  scenarios: jsonb('scenarios').notNull(),
  done: integer('done').notNull().default(0),
}, t => [primaryKey({ columns: [t.evaluationId, t.siteId] })])

/** The measured reduction of one scenario (one action, or a bundle of a site's actions). */
export const capitalScenarioResults = pgTable('capital_scenario_results', {
  evaluationId: uuid('evaluation_id').notNull().references(() => capitalEvaluations.id, { onDelete: 'cascade' }),
  key: text('key').notNull(),
  siteId: uuid('site_id').notNull(),
  actionIds: jsonb('action_ids').$type<string[]>().notNull(),
  /** MetricFigures (shared/capital/paired.ts): baseline, scenario, paired reduction, independent error. */
  figures: jsonb('figures').notNull(),
  reductionIgnition: doublePrecision('reduction_ignition').notNull(),
  reductionLoss: doublePrecision('reduction_loss').notNull(),
}, t => [
  primaryKey({ columns: [t.evaluationId, t.key] }),
  index('capital_scenario_results_site_idx').on(t.evaluationId, t.siteId),
])

/** A saved plan: the actions chosen for a budget from an evaluation's figures. */
export const capitalPlans = pgTable('capital_plans', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  budget: money('budget').notNull(),
  metric: planMetric('metric').notNull(),
  evaluationId: uuid('evaluation_id').references(() => capitalEvaluations.id, { onDelete: 'set null' }),
  actionIds: jsonb('action_ids').$type<string[]>().notNull(),
  totalCost: money('total_cost').notNull(),
  /** Sum of the single actions' reductions (per year, or money per year for loss). */
  reduction: doublePrecision('reduction').notNull(),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  uniqueIndex('capital_plans_org_name_unique').on(t.organisationId, t.name),
  index('capital_plans_evaluation_idx').on(t.evaluationId),
  check('capital_plans_budget_nonnegative', sql`${t.budget} >= 0 AND ${t.totalCost} <= ${t.budget}`),
])
