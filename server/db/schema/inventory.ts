// The inventory: portfolios → sites → tanks (with their internal components) and site structures,
// read-only portfolio shares between organisations, and the record of every spreadsheet import.
// Units: lengths in metres (m), positions in metres east (x) and north (y) of the site's reference
// point, flash density in flashes/km²/yr, thunderstorm days in days/yr, shield rating in kA,
// flash point in °C, money in the organisation's currency (numeric, 2 decimals).
import { sql } from 'drizzle-orm'
import { boolean, check, customType, doublePrecision, index, integer, jsonb, numeric, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { organisations, users } from './accounts'
import { timestamps } from './columns'
import { MONEY_NUMERIC } from '../../../shared/schemas/money'

// Enum values are the engine's input contract (ComponentClass, TankMaterial, Contents, StructureKind).
export const tankMaterial = pgEnum('tank_material', ['frp', 'polyethylene', 'steel', 'other'])
export const tankContents = pgEnum('tank_contents', ['crude', 'condensate', 'produced_water', 'fresh_water', 'chemical'])
export const componentClass = pgEnum('component_class', ['sharp_device', 'grounded_pipe', 'rounded_conductor', 'carbon_fibre'])
export const structureKind = pgEnum('structure_kind', ['mast', 'stack', 'ogw_support', 'building'])
/** Informational only: grounding does not change induced sparking (MODEL.md §4). */
export const tankGrounding = pgEnum('tank_grounding', ['none', 'single', 'multiple'])
export const importStatus = pgEnum('inventory_import_status', ['previewed', 'committing', 'committed', 'failed', 'rejected'])

const bytea = customType<{ data: Buffer, driverData: Buffer }>({ dataType: () => 'bytea' })
const money = (name: string) => numeric(name, { ...MONEY_NUMERIC.inventory, mode: 'number' })

export const portfolios = pgTable('portfolios', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  description: text('description').notNull().default(''),
  ...timestamps,
}, t => [
  uniqueIndex('portfolios_org_name_unique').on(t.organisationId, t.name),
])

export const sites = pgTable('sites', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  /** The organisation's own reference; imports match rows by it. */
  externalId: text('external_id').notNull(),
  name: text('name').notNull(),
  /** Whose site it is (an insurer keeps its own copy of the sites it insures). */
  operatorName: text('operator_name').notNull().default(''),
  latitudeDeg: doublePrecision('latitude_deg').notNull(),
  longitudeDeg: doublePrecision('longitude_deg').notNull(),
  /** Ground flash density Ng, flashes/km²/yr — or thunderstorm days, never both. */
  flashDensityPerKm2Yr: doublePrecision('flash_density_per_km2_yr'),
  thunderstormDaysPerYr: doublePrecision('thunderstorm_days_per_yr'),
  locationNotes: text('location_notes').notNull().default(''),
  /** Insured values of the site as a whole (property, business interruption), organisation currency. */
  insuredPropertyValue: money('insured_property_value'),
  insuredInterruptionValue: money('insured_interruption_value'),
  ...timestamps,
}, t => [
  uniqueIndex('sites_org_external_id_unique').on(t.organisationId, t.externalId),
  index('sites_org_name_idx').on(t.organisationId, t.name),
  index('sites_org_operator_idx').on(t.organisationId, t.operatorName),
  check('sites_latitude_range', sql`${t.latitudeDeg} BETWEEN -90 AND 90`),
  check('sites_longitude_range', sql`${t.longitudeDeg} BETWEEN -180 AND 180`),
  check('sites_one_flash_source', sql`(${t.flashDensityPerKm2Yr} IS NULL) <> (${t.thunderstormDaysPerYr} IS NULL)`),
  check('sites_flash_density_range', sql`${t.flashDensityPerKm2Yr} IS NULL OR (${t.flashDensityPerKm2Yr} > 0 AND ${t.flashDensityPerKm2Yr} <= 100)`),
  check('sites_thunderstorm_days_range', sql`${t.thunderstormDaysPerYr} IS NULL OR (${t.thunderstormDaysPerYr} > 0 AND ${t.thunderstormDaysPerYr} <= 366)`),
  check('sites_insured_values_nonnegative', sql`coalesce(${t.insuredPropertyValue}, 0) >= 0 AND coalesce(${t.insuredInterruptionValue}, 0) >= 0`),
])

/** Portfolio ↔ site, many-to-many within one organisation (enforced by the routes and the import). */
export const portfolioSites = pgTable('portfolio_sites', {
  portfolioId: uuid('portfolio_id').notNull().references(() => portfolios.id, { onDelete: 'cascade' }),
  siteId: uuid('site_id').notNull().references(() => sites.id, { onDelete: 'cascade' }),
  addedAt: timestamp('added_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  primaryKey({ columns: [t.portfolioId, t.siteId] }),
  index('portfolio_sites_site_idx').on(t.siteId),
])

/** Read-only access for another organisation to a portfolio and its sites, tanks and structures. */
export const portfolioShares = pgTable('portfolio_shares', {
  id: uuid('id').primaryKey().defaultRandom(),
  portfolioId: uuid('portfolio_id').notNull().references(() => portfolios.id, { onDelete: 'cascade' }),
  /** The receiving organisation. */
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  grantedBy: uuid('granted_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  uniqueIndex('portfolio_shares_unique').on(t.portfolioId, t.organisationId),
  index('portfolio_shares_org_idx').on(t.organisationId),
  index('portfolio_shares_granted_by_idx').on(t.grantedBy),
])

export const tanks = pgTable('tanks', {
  id: uuid('id').primaryKey().defaultRandom(),
  siteId: uuid('site_id').notNull().references(() => sites.id, { onDelete: 'cascade' }),
  /** Matched by imports within the site. */
  externalId: text('external_id').notNull(),
  tag: text('tag').notNull(),
  material: tankMaterial('material').notNull(),
  heightM: doublePrecision('height_m').notNull(),
  diameterM: doublePrecision('diameter_m').notNull(),
  /** Position of the tank's axis on the site plan, metres east / north of the reference point. */
  xM: doublePrecision('x_m').notNull(),
  yM: doublePrecision('y_m').notNull(),
  contents: tankContents('contents').notNull(),
  flammableVapourSpace: boolean('flammable_vapour_space').notNull(),
  /** Only for contents = chemical: flash point in °C. */
  chemicalFlashPointC: doublePrecision('chemical_flash_point_c'),
  grounding: tankGrounding('grounding').notNull().default('single'),
  /** Induced-sparking shield rating in kA (sparking suppressed up to this current); null = none. */
  shieldRatingKa: doublePrecision('shield_rating_ka'),
  vapourControl: boolean('vapour_control').notNull().default(false),
  /** Recorded only; no effect on the model (MODEL.md §4). */
  staticDissipator: boolean('static_dissipator').notNull().default(false),
  bondingUpgrade: boolean('bonding_upgrade').notNull().default(false),
  replacementValue: money('replacement_value').notNull().default(0),
  contentsValue: money('contents_value').notNull().default(0),
  cleanupCost: money('cleanup_cost').notNull().default(0),
  interruptionCost: money('interruption_cost').notNull().default(0),
  ...timestamps,
}, t => [
  index('tanks_site_idx').on(t.siteId),
  uniqueIndex('tanks_site_external_id_unique').on(t.siteId, t.externalId),
  uniqueIndex('tanks_site_tag_unique').on(t.siteId, t.tag),
  index('tanks_material_idx').on(t.material),
  index('tanks_contents_idx').on(t.contents),
  check('tanks_height_positive', sql`${t.heightM} > 0 AND ${t.heightM} <= 100`),
  check('tanks_diameter_positive', sql`${t.diameterM} > 0 AND ${t.diameterM} <= 200`),
  check('tanks_position_range', sql`abs(${t.xM}) <= 5000 AND abs(${t.yM}) <= 5000`),
  check('tanks_shield_positive', sql`${t.shieldRatingKa} IS NULL OR (${t.shieldRatingKa} > 0 AND ${t.shieldRatingKa} <= 500)`),
  check('tanks_flash_point_range', sql`${t.chemicalFlashPointC} IS NULL OR ${t.chemicalFlashPointC} BETWEEN -100 AND 400`),
  check('tanks_money_nonnegative', sql`${t.replacementValue} >= 0 AND ${t.contentsValue} >= 0 AND ${t.cleanupCost} >= 0 AND ${t.interruptionCost} >= 0`),
])

/** Internal conducting components of a tank, one row per class. */
export const tankComponents = pgTable('tank_components', {
  id: uuid('id').primaryKey().defaultRandom(),
  tankId: uuid('tank_id').notNull().references(() => tanks.id, { onDelete: 'cascade' }),
  componentClass: componentClass('component_class').notNull(),
  count: integer('count').notNull(),
  /** Height of the tallest part of the class above the tank floor, m. */
  heightM: doublePrecision('height_m').notNull(),
}, t => [
  uniqueIndex('tank_components_tank_class_unique').on(t.tankId, t.componentClass),
  check('tank_components_count_positive', sql`${t.count} > 0 AND ${t.count} <= 1000`),
  check('tank_components_height_positive', sql`${t.heightM} > 0 AND ${t.heightM} <= 100`),
])

/** Masts, stacks, overhead ground wire supports and buildings that attract flashes near the tanks. */
export const siteStructures = pgTable('site_structures', {
  id: uuid('id').primaryKey().defaultRandom(),
  siteId: uuid('site_id').notNull().references(() => sites.id, { onDelete: 'cascade' }),
  externalId: text('external_id').notNull(),
  kind: structureKind('kind').notNull(),
  label: text('label').notNull().default(''),
  xM: doublePrecision('x_m').notNull(),
  yM: doublePrecision('y_m').notNull(),
  heightM: doublePrecision('height_m').notNull(),
  radiusM: doublePrecision('radius_m').notNull(),
  ...timestamps,
}, t => [
  index('site_structures_site_idx').on(t.siteId),
  uniqueIndex('site_structures_site_external_id_unique').on(t.siteId, t.externalId),
  check('site_structures_height_positive', sql`${t.heightM} > 0 AND ${t.heightM} <= 500`),
  check('site_structures_radius_positive', sql`${t.radiusM} > 0 AND ${t.radiusM} <= 200`),
  check('site_structures_position_range', sql`abs(${t.xM}) <= 5000 AND abs(${t.yM}) <= 5000`),
])

/** One uploaded inventory file: the original bytes, what the preview found, and whether it was committed. */
/** Rows of the file, rows checked against the inventory, rows to write (new or changed) and rows written so far. */
export interface ImportProgress { rowsTotal: number, rowsChecked: number, rowsToWrite: number, rowsWritten: number }

export const inventoryImports = pgTable('inventory_imports', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  uploadedBy: uuid('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
  fileName: text('file_name').notNull(),
  contentType: text('content_type').notNull(),
  sizeBytes: integer('size_bytes').notNull(),
  /** Legacy copy of the original file; emptied once scripts/move-files-to-storage.ts has moved it to object storage. */
  fileData: bytea('file_data'),
  /** The original file, kept as uploaded, in object storage (server/storage/objects.ts): its key and SHA-256. */
  fileKey: text('file_key'),
  fileSha256: text('file_sha256'),
  status: importStatus('status').notNull(),
  /** Counts per sheet: new, changed, unchanged, errors. */
  summary: jsonb('summary').notNull(),
  /** Row-level errors (sheet, row, column, message); capped at 1,000. */
  errors: jsonb('errors').notNull(),
  committedAt: timestamp('committed_at', { withTimezone: true }),
  /** Who asked for the commit (mailed when a background commit ends). */
  committedBy: uuid('committed_by').references(() => users.id, { onDelete: 'set null' }),
  /** Portfolio that the commit adds the file's sites to, if any (kept for the background job). */
  commitPortfolioId: uuid('commit_portfolio_id').references(() => portfolios.id, { onDelete: 'set null' }),
  /** A commit's progress (background commits update it as they go). */
  progress: jsonb('progress').$type<ImportProgress>(),
  /** Why a background commit failed, in words. */
  failureMessage: text('failure_message'),
  ...timestamps,
}, t => [
  index('inventory_imports_org_idx').on(t.organisationId, t.createdAt),
  index('inventory_imports_committed_by_idx').on(t.committedBy),
  index('inventory_imports_commit_portfolio_idx').on(t.commitPortfolioId),
  index('inventory_imports_uploaded_by_idx').on(t.uploadedBy),
  index('inventory_imports_status_idx').on(t.status),
  check('inventory_imports_size', sql`${t.sizeBytes} >= 0`),
  check('inventory_imports_file_kept', sql`${t.fileKey} IS NOT NULL OR ${t.fileData} IS NOT NULL`),
])

export type TankMaterial = (typeof tankMaterial.enumValues)[number]
export type TankContents = (typeof tankContents.enumValues)[number]
export type ComponentClass = (typeof componentClass.enumValues)[number]
export type StructureKind = (typeof structureKind.enumValues)[number]
export type TankGrounding = (typeof tankGrounding.enumValues)[number]
