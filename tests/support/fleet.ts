// Small generated fleets for run tests, written straight into the inventory tables.
import type pg from 'pg'
import seedrandom from 'seedrandom'
import type { SiteInput } from '../../shared/engine/types'

export interface FleetOptions { sites: number, tanksPerSite: number, seed?: string, name?: string }

const CONTENTS = ['crude', 'condensate', 'produced_water', 'chemical'] as const
const CLASSES = ['sharp_device', 'grounded_pipe', 'rounded_conductor', 'carbon_fibre'] as const

/** Creates a portfolio with generated sites, tanks, components and a mast per third site. Returns its id. */
export async function createFleet(pool: pg.Pool, organisationId: string, o: FleetOptions): Promise<string> {
  const rand = seedrandom(o.seed ?? 'fleet')
  const { rows: [portfolio] } = await pool.query(
    `INSERT INTO portfolios (organisation_id, name) VALUES ($1, $2) RETURNING id`, [organisationId, o.name ?? `Fleet ${Math.random().toString(36).slice(2, 7)}`])
  for (let s = 0; s < o.sites; s++) {
    const { rows: [site] } = await pool.query(
      `INSERT INTO sites (organisation_id, external_id, name, operator_name, latitude_deg, longitude_deg, flash_density_per_km2_yr, insured_property_value)
       VALUES ($1, $2, $3, 'Generated operator', $4, $5, $6, $7) RETURNING id`,
      [organisationId, `S-${portfolio.id.slice(0, 4)}-${s}`, `Generated site ${s + 1}`, 31 + rand() * 2, -103 + rand() * 2, 2 + rand() * 6, 1_000_000])
    await pool.query(`INSERT INTO portfolio_sites (portfolio_id, site_id) VALUES ($1, $2)`, [portfolio.id, site.id])
    for (let t = 0; t < o.tanksPerSite; t++) {
      const height = 3 + rand() * 7
      const contents = CONTENTS[Math.floor(rand() * CONTENTS.length)]!
      const { rows: [tank] } = await pool.query(
        `INSERT INTO tanks (site_id, external_id, tag, material, height_m, diameter_m, x_m, y_m, contents, flammable_vapour_space,
          chemical_flash_point_c, replacement_value, contents_value, cleanup_cost, interruption_cost)
         VALUES ($1, $2, $3, 'frp', $4, $5, $6, $7, $8, true, $9, 120000, 40000, 60000, 80000) RETURNING id`,
        [site.id, `T-${t}`, `TK-${100 + t}`, height, 3 + rand() * 3, t * 12, rand() * 10, contents, contents === 'chemical' ? 20 : null])
      const cls = CLASSES[Math.floor(rand() * CLASSES.length)]!
      await pool.query(`INSERT INTO tank_components (tank_id, component_class, count, height_m) VALUES ($1, $2, $3, $4)`, [tank.id, cls, 1 + Math.floor(rand() * 3), height * 0.9])
    }
    if (s % 3 === 0) {
      await pool.query(`INSERT INTO site_structures (site_id, external_id, kind, x_m, y_m, height_m, radius_m) VALUES ($1, 'M-1', 'mast', -20, 15, 25, 0.5)`, [site.id])
    }
  }
  return portfolio.id
}

export async function createDefaultAssumptions(pool: pg.Pool, organisationId: string, parameters: unknown): Promise<string> {
  const { rows: [set] } = await pool.query(`INSERT INTO assumption_sets (organisation_id, name) VALUES ($1, $2) RETURNING id`, [organisationId, `Set ${Math.random().toString(36).slice(2, 7)}`])
  const { rows: [version] } = await pool.query(`INSERT INTO assumption_set_versions (assumption_set_id, version, parameters) VALUES ($1, 1, $2) RETURNING id`, [set.id, JSON.stringify(parameters)])
  return version.id
}

/** Writes engine-shaped sites (e.g. bench/engine-portfolio.ts) into a new portfolio; returns its id. */
export async function insertSites(pool: pg.Pool, organisationId: string, name: string, sites: SiteInput[]): Promise<string> {
  const { rows: [portfolio] } = await pool.query(`INSERT INTO portfolios (organisation_id, name) VALUES ($1, $2) RETURNING id`, [organisationId, name])
  for (const [k, s] of sites.entries()) {
    const { rows: [site] } = await pool.query(
      `INSERT INTO sites (organisation_id, external_id, name, operator_name, latitude_deg, longitude_deg, flash_density_per_km2_yr, insured_property_value)
       VALUES ($1, $2, $3, 'Generated operator', $4, $5, $6, 1000000) RETURNING id`,
      [organisationId, `${name}-${k}`, s.name, 31 + (k % 40) * 0.05, -103 + Math.floor(k / 40) * 0.05, s.flashDensity])
    await pool.query(`INSERT INTO portfolio_sites (portfolio_id, site_id) VALUES ($1, $2)`, [portfolio.id, site.id])
    for (const t of s.tanks) {
      const { rows: [tank] } = await pool.query(
        `INSERT INTO tanks (site_id, external_id, tag, material, height_m, diameter_m, x_m, y_m, contents, flammable_vapour_space, chemical_flash_point_c,
          shield_rating_ka, vapour_control, replacement_value, contents_value, cleanup_cost, interruption_cost)
         VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15, $16, $17) RETURNING id`,
        [site.id, t.id, t.tag, t.material, t.heightM, t.diameterM, t.xM, t.yM, t.contents, t.flammableVapourSpace, t.chemicalFlashPointC ?? null,
          t.shieldRatingKa, t.vapourControl, t.replacementValue, t.contentsValue, t.cleanupCost, t.interruptionCost])
      for (const c of t.components) {
        await pool.query(`INSERT INTO tank_components (tank_id, component_class, count, height_m) VALUES ($1, $2, $3, $4)`, [tank.id, c.componentClass, c.count, c.heightM])
      }
    }
    for (const st of s.structures) {
      await pool.query(`INSERT INTO site_structures (site_id, external_id, kind, x_m, y_m, height_m, radius_m) VALUES ($1, $2, $3, $4, $5, $6, $7)`, [site.id, st.id, st.kind, st.xM, st.yM, st.heightM, st.radiusM])
    }
  }
  return portfolio.id
}
