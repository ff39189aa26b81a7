// Role rules for referrals (PRODUCT.md: underwriters annotate sites; everyone reads; every member but
// viewers replies; the assignee's own right to move a status is checked after the guard, in
// tests/server/referrals.test.ts).
import type pg from 'pg'
import type { RouteRule } from './types'

export const rules: RouteRule[] = [
  { method: 'GET', file: 'server/api/sites/[id]/notes.get.ts', path: '/api/sites/[id]/notes', allowed: ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer'], params: { id: 'noteSiteId' } },
  { method: 'POST', file: 'server/api/sites/[id]/notes.post.ts', path: '/api/sites/[id]/notes', allowed: ['admin', 'underwriter'], params: { id: 'noteSiteId' }, body: { body: 'Probe note' } },
  { method: 'GET', file: 'server/api/referrals/index.get.ts', path: '/api/referrals', allowed: ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer'] },
  { method: 'GET', file: 'server/api/referrals/assignees.get.ts', path: '/api/referrals/assignees', allowed: ['admin', 'underwriter'] },
  { method: 'PATCH', file: 'server/api/referrals/[id].patch.ts', path: '/api/referrals/[id]', allowed: ['admin', 'analyst', 'underwriter', 'asset_manager'], params: { id: 'noteId' }, body: { status: 'in_review' } },
  { method: 'POST', file: 'server/api/referrals/[id]/replies.post.ts', path: '/api/referrals/[id]/replies', allowed: ['admin', 'analyst', 'underwriter', 'asset_manager'], params: { id: 'noteId' }, body: { body: 'Probe reply' } },
]

export async function fixtures(pool: pg.Pool, organisationId: string): Promise<Record<string, string>> {
  const { rows: [site] } = await pool.query(
    `INSERT INTO sites (organisation_id, external_id, name, latitude_deg, longitude_deg, flash_density_per_km2_yr) VALUES ($1, 'NOTE-1', 'Note site', 32, -102, 4) RETURNING id`, [organisationId])
  const { rows: [note] } = await pool.query(`INSERT INTO site_notes (organisation_id, site_id, body) VALUES ($1, $2, 'A note') RETURNING id`, [organisationId, site.id])
  return { noteSiteId: site.id, noteId: note.id }
}
