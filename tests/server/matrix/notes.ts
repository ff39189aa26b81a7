// Role rules for referral notes (PRODUCT.md: underwriters annotate sites; everyone reads).
import type pg from 'pg'
import type { RouteRule } from './types'

export const rules: RouteRule[] = [
  { method: 'GET', file: 'server/api/sites/[id]/notes.get.ts', path: '/api/sites/[id]/notes', allowed: ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer'], params: { id: 'noteSiteId' } },
  { method: 'POST', file: 'server/api/sites/[id]/notes.post.ts', path: '/api/sites/[id]/notes', allowed: ['admin', 'underwriter'], params: { id: 'noteSiteId' }, body: { body: 'Probe note' } },
]

export async function fixtures(pool: pg.Pool, organisationId: string): Promise<Record<string, string>> {
  const { rows: [site] } = await pool.query(
    `INSERT INTO sites (organisation_id, external_id, name, latitude_deg, longitude_deg, flash_density_per_km2_yr) VALUES ($1, 'NOTE-1', 'Note site', 32, -102, 4) RETURNING id`, [organisationId])
  await pool.query(`INSERT INTO site_notes (organisation_id, site_id, body) VALUES ($1, $2, 'A note')`, [organisationId, site.id])
  return { noteSiteId: site.id }
}
