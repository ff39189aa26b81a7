// The inventory as rows of the template layout (export → import shows no change).
import { asc, eq, getTableColumns, inArray } from 'drizzle-orm'
import type { Database } from '../db'
import { siteStructures, sites, tankComponents, tanks } from '../db/schema'
import { COMPONENT_CLASSES } from '../../shared/schemas/inventory'
import type { SheetRows } from './workbook'

/** Rows for the given sites (the caller has scoped the ids to what the member may read). */
export async function inventoryRows(db: Database, siteIds: string[]): Promise<SheetRows> {
  const out: SheetRows = { Sites: [], Tanks: [], Structures: [] }
  if (siteIds.length === 0) return out
  const siteRows = await db.select().from(sites).where(inArray(sites.id, siteIds)).orderBy(asc(sites.externalId))
  const externalById = new Map(siteRows.map(s => [s.id, s.externalId]))
  for (const s of siteRows) {
    out.Sites.push({
      site_external_id: s.externalId, name: s.name, operator: s.operatorName, latitude_deg: s.latitudeDeg, longitude_deg: s.longitudeDeg,
      flash_density_per_km2_yr: s.flashDensityPerKm2Yr, thunderstorm_days_per_yr: s.thunderstormDaysPerYr,
      insured_property_value: s.insuredPropertyValue, insured_interruption_value: s.insuredInterruptionValue, location_notes: s.locationNotes,
    })
  }
  const tankRows = await db.select().from(tanks).where(inArray(tanks.siteId, siteIds)).orderBy(asc(tanks.siteId), asc(tanks.externalId))
  const components = tankRows.length === 0 ? [] : await db.select(getTableColumns(tankComponents)).from(tankComponents).innerJoin(tanks, eq(tanks.id, tankComponents.tankId)).where(inArray(tanks.siteId, siteIds))
  const byTank = new Map<string, typeof components>()
  for (const c of components) byTank.set(c.tankId, [...(byTank.get(c.tankId) ?? []), c])
  for (const t of tankRows) {
    const row: Record<string, unknown> = {
      site_external_id: externalById.get(t.siteId), tank_external_id: t.externalId, tag: t.tag, material: t.material,
      height_m: t.heightM, diameter_m: t.diameterM, x_m: t.xM, y_m: t.yM, contents: t.contents,
      flammable_vapour_space: t.flammableVapourSpace, chemical_flash_point_c: t.chemicalFlashPointC, grounding: t.grounding,
      shield_rating_ka: t.shieldRatingKa, vapour_control: t.vapourControl, static_dissipator: t.staticDissipator, bonding_upgrade: t.bondingUpgrade,
      replacement_value: t.replacementValue, contents_value: t.contentsValue, cleanup_cost: t.cleanupCost, interruption_cost: t.interruptionCost,
    }
    for (const cls of COMPONENT_CLASSES) {
      const c = byTank.get(t.id)?.find(x => x.componentClass === cls)
      row[`${cls}_count`] = c?.count ?? null
      row[`${cls}_height_m`] = c?.heightM ?? null
    }
    out.Tanks.push(row)
  }
  const structureRows = await db.select().from(siteStructures).where(inArray(siteStructures.siteId, siteIds)).orderBy(asc(siteStructures.siteId), asc(siteStructures.externalId))
  for (const s of structureRows) {
    out.Structures.push({
      site_external_id: externalById.get(s.siteId), structure_external_id: s.externalId, kind: s.kind, label: s.label,
      x_m: s.xM, y_m: s.yM, height_m: s.heightM, radius_m: s.radiusM,
    })
  }
  return out
}
