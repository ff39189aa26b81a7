// TEMPORARY (calibration branch only): the columns of the inventory's `sites` table that calibration
// reads and writes, so this branch's database has them before the merge. Deleted before the merge;
// the inventory's definition replaces it. Calibration code reaches sites through SQL only.
import { sql } from 'drizzle-orm'
import { check, doublePrecision, pgTable, text, uuid } from 'drizzle-orm/pg-core'
import { organisations } from './accounts'
import { timestamps } from './columns'

export const sites = pgTable('sites', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisationId: uuid('organisation_id').notNull().references(() => organisations.id, { onDelete: 'cascade' }),
  externalId: text('external_id').notNull(),
  name: text('name').notNull(),
  latitudeDeg: doublePrecision('latitude_deg').notNull(),
  longitudeDeg: doublePrecision('longitude_deg').notNull(),
  flashDensityPerKm2Yr: doublePrecision('flash_density_per_km2_yr'),
  thunderstormDaysPerYr: doublePrecision('thunderstorm_days_per_yr'),
  ...timestamps,
}, t => [
  check('sites_one_flash_source', sql`(${t.flashDensityPerKm2Yr} IS NULL) <> (${t.thunderstormDaysPerYr} IS NULL)`),
  check('sites_flash_density_range', sql`${t.flashDensityPerKm2Yr} IS NULL OR (${t.flashDensityPerKm2Yr} > 0 AND ${t.flashDensityPerKm2Yr} <= 100)`),
])
