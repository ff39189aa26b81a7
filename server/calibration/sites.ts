// The inventory's sites as calibration sees them: their reference points and flash densities.
// Reached through SQL on the inventory's columns, so calibration does not depend on its module.
import { sql } from 'drizzle-orm'
import { useDb, type Database } from '../db'

export interface CalibrationSite {
  id: string
  externalId: string
  name: string
  latDeg: number
  lonDeg: number
  flashDensity: number | null
  thunderstormDays: number | null
}

type Executor = Pick<Database, 'execute'>

function toSite(r: Record<string, unknown>): CalibrationSite {
  return {
    id: String(r.id), externalId: String(r.external_id), name: String(r.name),
    latDeg: Number(r.latitude_deg), lonDeg: Number(r.longitude_deg),
    flashDensity: r.flash_density_per_km2_yr === null ? null : Number(r.flash_density_per_km2_yr),
    thunderstormDays: r.thunderstorm_days_per_yr === null ? null : Number(r.thunderstorm_days_per_yr),
  }
}

export async function listSites(organisationId: string): Promise<CalibrationSite[]> {
  const { rows } = await useDb().execute(sql`
    SELECT id, external_id, name, latitude_deg, longitude_deg, flash_density_per_km2_yr, thunderstorm_days_per_yr
    FROM sites WHERE organisation_id = ${organisationId} ORDER BY name, external_id`)
  return rows.map(toSite)
}

/** The organisation's sites among `ids`; ids of other organisations are simply absent. */
export async function findSites(organisationId: string, ids: readonly string[], executor: Executor = useDb(), forUpdate = false): Promise<CalibrationSite[]> {
  if (ids.length === 0) return []
  const { rows } = await executor.execute(sql`
    SELECT id, external_id, name, latitude_deg, longitude_deg, flash_density_per_km2_yr, thunderstorm_days_per_yr
    FROM sites WHERE organisation_id = ${organisationId} AND id IN (${sql.join(ids.map(id => sql`${id}::uuid`), sql`, `)})
    ${forUpdate ? sql`FOR UPDATE` : sql``}`)
  return rows.map(toSite)
}

/** Sets a site's ground flash density; thunderstorm days are cleared (a site has one or the other). */
export async function setSiteFlashDensity(executor: Executor, organisationId: string, siteId: string, ng: number): Promise<void> {
  await executor.execute(sql`
    UPDATE sites SET flash_density_per_km2_yr = ${ng}, thunderstorm_days_per_yr = NULL, updated_at = now()
    WHERE id = ${siteId}::uuid AND organisation_id = ${organisationId}`)
}
