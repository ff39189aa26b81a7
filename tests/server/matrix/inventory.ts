// Role × route rules of the inventory (portfolios, sites, tanks, structures, import and export).
// Editors (admin, analyst) change the inventory; everyone reads it; exporters export; admins share.
import type pg from 'pg'
import type { MatrixModule, RoleName, RouteRule } from './types'

const everyone: RoleName[] = ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer']
const editors: RoleName[] = ['admin', 'analyst']
const exporters: RoleName[] = ['admin', 'analyst', 'underwriter', 'asset_manager']
const admins: RoleName[] = ['admin']

export const rules: RouteRule[] = [
  { method: 'GET', file: 'server/api/portfolios/index.get.ts', path: '/api/portfolios', allowed: everyone },
  { method: 'POST', file: 'server/api/portfolios/index.post.ts', path: '/api/portfolios', allowed: editors },
  { method: 'GET', file: 'server/api/portfolios/[id].get.ts', path: '/api/portfolios/[id]', allowed: everyone, params: { id: 'portfolioId' } },
  { method: 'PATCH', file: 'server/api/portfolios/[id].patch.ts', path: '/api/portfolios/[id]', allowed: editors, params: { id: 'portfolioId' } },
  { method: 'DELETE', file: 'server/api/portfolios/[id].delete.ts', path: '/api/portfolios/[id]', allowed: editors, params: { id: 'portfolioId' } },
  { method: 'POST', file: 'server/api/portfolios/[id]/sites.post.ts', path: '/api/portfolios/[id]/sites', allowed: editors, params: { id: 'portfolioId' } },
  { method: 'POST', file: 'server/api/portfolios/[id]/shares.post.ts', path: '/api/portfolios/[id]/shares', allowed: admins, params: { id: 'portfolioId' } },
  { method: 'DELETE', file: 'server/api/portfolios/[id]/shares/[shareId].delete.ts', path: '/api/portfolios/[id]/shares/[shareId]', allowed: admins, params: { id: 'portfolioId', shareId: 'shareId' } },
  { method: 'GET', file: 'server/api/sites/index.get.ts', path: '/api/sites', allowed: everyone },
  { method: 'POST', file: 'server/api/sites/index.post.ts', path: '/api/sites', allowed: editors },
  { method: 'GET', file: 'server/api/sites/[id].get.ts', path: '/api/sites/[id]', allowed: everyone, params: { id: 'siteId' } },
  { method: 'PATCH', file: 'server/api/sites/[id].patch.ts', path: '/api/sites/[id]', allowed: editors, params: { id: 'siteId' } },
  { method: 'DELETE', file: 'server/api/sites/[id].delete.ts', path: '/api/sites/[id]', allowed: editors, params: { id: 'siteId' } },
  { method: 'POST', file: 'server/api/sites/[id]/tanks.post.ts', path: '/api/sites/[id]/tanks', allowed: editors, params: { id: 'siteId' } },
  { method: 'POST', file: 'server/api/sites/[id]/structures.post.ts', path: '/api/sites/[id]/structures', allowed: editors, params: { id: 'siteId' } },
  { method: 'GET', file: 'server/api/tanks/[id].get.ts', path: '/api/tanks/[id]', allowed: everyone, params: { id: 'tankId' } },
  { method: 'PATCH', file: 'server/api/tanks/[id].patch.ts', path: '/api/tanks/[id]', allowed: editors, params: { id: 'tankId' } },
  { method: 'DELETE', file: 'server/api/tanks/[id].delete.ts', path: '/api/tanks/[id]', allowed: editors, params: { id: 'tankId' } },
  { method: 'PATCH', file: 'server/api/structures/[id].patch.ts', path: '/api/structures/[id]', allowed: editors, params: { id: 'structureId' } },
  { method: 'DELETE', file: 'server/api/structures/[id].delete.ts', path: '/api/structures/[id]', allowed: editors, params: { id: 'structureId' } },
  { method: 'GET', file: 'server/api/inventory/template.get.ts', path: '/api/inventory/template', allowed: everyone },
  { method: 'GET', file: 'server/api/inventory/export.get.ts', path: '/api/inventory/export', allowed: exporters },
  { method: 'POST', file: 'server/api/inventory/imports/index.post.ts', path: '/api/inventory/imports', allowed: editors },
  { method: 'GET', file: 'server/api/inventory/imports/[id].get.ts', path: '/api/inventory/imports/[id]', allowed: editors, params: { id: 'importId' } },
  { method: 'POST', file: 'server/api/inventory/imports/[id]/commit.post.ts', path: '/api/inventory/imports/[id]/commit', allowed: editors, params: { id: 'importId' } },
]

/** A portfolio holding a site with one tank (two components) and one mast, a share and a previewed import. */
export async function fixtures(pool: pg.Pool, organisationId: string): Promise<Record<string, string>> {
  const suffix = Math.random().toString(36).slice(2, 8)
  const one = async (text: string, values: unknown[]) => (await pool.query(text, values)).rows[0].id as string
  const portfolioId = await one(`INSERT INTO portfolios (organisation_id, name) VALUES ($1, $2) RETURNING id`, [organisationId, `Fixture portfolio ${suffix}`])
  const siteId = await one(`INSERT INTO sites (organisation_id, external_id, name, operator_name, latitude_deg, longitude_deg, flash_density_per_km2_yr)
    VALUES ($1, $2, 'Fixture site', 'Fixture operator', 32.1, -102.4, 4.5) RETURNING id`, [organisationId, `FX-${suffix}`])
  await pool.query(`INSERT INTO portfolio_sites (portfolio_id, site_id) VALUES ($1, $2)`, [portfolioId, siteId])
  const tankId = await one(`INSERT INTO tanks (site_id, external_id, tag, material, height_m, diameter_m, x_m, y_m, contents, flammable_vapour_space)
    VALUES ($1, 'T1', 'TK-1', 'frp', 6, 4, 0, 0, 'crude', true) RETURNING id`, [siteId])
  await pool.query(`INSERT INTO tank_components (tank_id, component_class, count, height_m) VALUES ($1, 'sharp_device', 1, 5), ($1, 'grounded_pipe', 2, 5.5)`, [tankId])
  const structureId = await one(`INSERT INTO site_structures (site_id, external_id, kind, x_m, y_m, height_m, radius_m) VALUES ($1, 'M1', 'mast', 20, 10, 25, 0.5) RETURNING id`, [siteId])
  const otherOrg = await one(`INSERT INTO organisations (name, kind) VALUES ($1, 'insurer') RETURNING id`, [`Fixture share receiver ${suffix}`])
  const shareId = await one(`INSERT INTO portfolio_shares (portfolio_id, organisation_id) VALUES ($1, $2) RETURNING id`, [portfolioId, otherOrg])
  const importId = await one(`INSERT INTO inventory_imports (organisation_id, file_name, content_type, size_bytes, file_data, status, summary, errors)
    VALUES ($1, 'fixture.csv', 'text/csv', 3, '\\x616263', 'previewed', '{}', '[]') RETURNING id`, [organisationId])
  return { portfolioId, siteId, tankId, structureId, shareId, importId }
}

export default { rules, fixtures } satisfies MatrixModule
