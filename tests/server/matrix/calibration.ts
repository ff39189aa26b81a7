// Role × route rules for calibration (issue 9): reading is open to every member; uploading,
// calibrating and applying results are for analysts and admins (PRODUCT.md roles).
import { gzipSync } from 'node:zlib'
import type pg from 'pg'
import type { RoleName, RouteRule } from './types'

const editors: RoleName[] = ['admin', 'analyst']
const everyone: RoleName[] = ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer']

export const rules: RouteRule[] = [
  { method: 'GET', file: 'server/api/calibrations/index.get.ts', path: '/api/calibrations', allowed: everyone },
  { method: 'GET', file: 'server/api/calibrations/[id].get.ts', path: '/api/calibrations/[id]', allowed: everyone, params: { id: 'calibrationId' } },
  { method: 'POST', file: 'server/api/calibrations/[id]/archive.post.ts', path: '/api/calibrations/[id]/archive', allowed: editors, params: { id: 'calibrationId' } },
  { method: 'DELETE', file: 'server/api/calibrations/[id].delete.ts', path: '/api/calibrations/[id]', allowed: editors, params: { id: 'calibrationId' } },
  { method: 'GET', file: 'server/api/calibrations/[id]/source.get.ts', path: '/api/calibrations/[id]/source', allowed: everyone, params: { id: 'calibrationId' } },
  { method: 'POST', file: 'server/api/calibrations/[id]/assumption-version.post.ts', path: '/api/calibrations/[id]/assumption-version', allowed: editors, params: { id: 'calibrationId' }, body: { assumptionVersionId: '00000000-0000-4000-8000-000000000000' } },
  { method: 'POST', file: 'server/api/calibrations/[id]/site-flash-densities.post.ts', path: '/api/calibrations/[id]/site-flash-densities', allowed: editors, params: { id: 'calibrationId' }, body: { siteIds: ['00000000-0000-4000-8000-000000000000'] } },
  { method: 'POST', file: 'server/api/calibrations/lightning.post.ts', path: '/api/calibrations/lightning', allowed: editors },
  { method: 'POST', file: 'server/api/calibrations/storm-clustering.post.ts', path: '/api/calibrations/storm-clustering', allowed: editors },
  { method: 'POST', file: 'server/api/calibrations/impulse.post.ts', path: '/api/calibrations/impulse', allowed: editors },
  { method: 'GET', file: 'server/api/calibrations/sites.get.ts', path: '/api/calibrations/sites', allowed: editors },
  { method: 'GET', file: 'server/api/calibrations/lightning-files/index.get.ts', path: '/api/calibrations/lightning-files', allowed: editors },
  { method: 'POST', file: 'server/api/calibrations/lightning-files/index.post.ts', path: '/api/calibrations/lightning-files', allowed: editors },
]

/** One impulse calibration with its source file in the organisation. */
export async function fixtures(pool: pg.Pool, organisationId: string): Promise<Record<string, string>> {
  const text = 'level_kv,spark\n90,no\n92,yes\n'
  const file = await pool.query(
    `INSERT INTO calibration_files (organisation_id, kind, file_name, byte_size, row_count, sha256, content_gzip, summary)
     VALUES ($1, 'impulse', 'fixture.csv', $2, 2, 'fixture', $3, '{}') RETURNING id`,
    [organisationId, Buffer.byteLength(text), gzipSync(text)],
  )
  const calibration = await pool.query(
    `INSERT INTO calibrations (organisation_id, kind, title, file_id, inputs, results) VALUES ($1, 'impulse', 'Fixture series', $2, '{}', '{}') RETURNING id`,
    [organisationId, file.rows[0].id],
  )
  return { calibrationId: calibration.rows[0].id }
}
