// Role rules for assumption sets and runs (PRODUCT.md: analysts and admins edit and start runs; everyone reads).
import type pg from 'pg'
import { defaultAssumptions } from '../../../shared/engine/assumptions'
import { createDefaultAssumptions, createFleet } from '../../support/fleet'
import type { RouteRule } from './types'

const everyone = ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer'] as const
const editors = ['admin', 'analyst'] as const

export const rules: RouteRule[] = [
  { method: 'GET', file: 'server/api/assumption-sets/index.get.ts', path: '/api/assumption-sets', allowed: [...everyone] },
  { method: 'POST', file: 'server/api/assumption-sets/index.post.ts', path: '/api/assumption-sets', allowed: [...editors] },
  { method: 'GET', file: 'server/api/assumption-sets/[id].get.ts', path: '/api/assumption-sets/[id]', allowed: [...everyone], params: { id: 'assumptionSetId' } },
  { method: 'POST', file: 'server/api/assumption-sets/[id]/archive.post.ts', path: '/api/assumption-sets/[id]/archive', allowed: [...editors], params: { id: 'assumptionSetId' } },
  { method: 'DELETE', file: 'server/api/assumption-sets/[id].delete.ts', path: '/api/assumption-sets/[id]', allowed: [...editors], params: { id: 'assumptionSetId' } },
  { method: 'GET', file: 'server/api/assumption-versions/[id].get.ts', path: '/api/assumption-versions/[id]', allowed: [...everyone], params: { id: 'assumptionVersionId' } },
  { method: 'PATCH', file: 'server/api/assumption-versions/[id].patch.ts', path: '/api/assumption-versions/[id]', allowed: [...editors], params: { id: 'assumptionVersionId' }, body: { parameters: {} } },
  { method: 'GET', file: 'server/api/runs/index.get.ts', path: '/api/runs', allowed: [...everyone] },
  { method: 'POST', file: 'server/api/runs/index.post.ts', path: '/api/runs', allowed: [...editors] },
  { method: 'GET', file: 'server/api/runs/[id].get.ts', path: '/api/runs/[id]', allowed: [...everyone], params: { id: 'runId' } },
  { method: 'POST', file: 'server/api/runs/[id]/cancel.post.ts', path: '/api/runs/[id]/cancel', allowed: [...editors], params: { id: 'runId' } },
  { method: 'PATCH', file: 'server/api/runs/[id].patch.ts', path: '/api/runs/[id]', allowed: [...editors], params: { id: 'runId' }, body: { name: 'Renamed in the matrix' } },
  { method: 'POST', file: 'server/api/runs/[id]/reference.post.ts', path: '/api/runs/[id]/reference', allowed: [...editors], params: { id: 'runId' } },
  { method: 'POST', file: 'server/api/runs/[id]/retry.post.ts', path: '/api/runs/[id]/retry', allowed: [...editors], params: { id: 'runId' } },
]

/** An assumption set with one version and a finished (cancelled) run, in the given organisation. */
export async function fixtures(pool: pg.Pool, organisationId: string): Promise<Record<string, string>> {
  const assumptionVersionId = await createDefaultAssumptions(pool, organisationId, defaultAssumptions)
  const { rows: [version] } = await pool.query(`SELECT assumption_set_id FROM assumption_set_versions WHERE id = $1`, [assumptionVersionId])
  const portfolioId = await createFleet(pool, organisationId, { sites: 1, tanksPerSite: 1, seed: 'matrix' })
  const { rows: [run] } = await pool.query(
    `INSERT INTO runs (organisation_id, portfolio_id, portfolio_name, assumption_version_id, mode, seed, target_rse, max_samples_per_tank, years,
      chunk_size, sites_total, tanks_total, chunks_total, input_hash, engine_version, state)
     VALUES ($1, $2, 'Matrix fleet', $3, 'frequency', 1, 0.2, 4000, 1000, 1, 1, 1, 1, 'x', 'test', 'cancelled') RETURNING id`,
    [organisationId, portfolioId, assumptionVersionId])
  const { rows: [site] } = await pool.query(`SELECT site_id FROM portfolio_sites WHERE portfolio_id = $1 LIMIT 1`, [portfolioId])
  return { assumptionSetId: version.assumption_set_id, assumptionVersionId, runId: run.id, siteIdOfRun: site.site_id }
}

rules.push(
  { method: 'GET', file: 'server/api/runs/latest.get.ts', path: '/api/runs/latest', allowed: [...everyone] },
  { method: 'GET', file: 'server/api/runs/[id]/dashboard.get.ts', path: '/api/runs/[id]/dashboard', allowed: [...everyone], params: { id: 'runId' } },
  { method: 'GET', file: 'server/api/runs/[id]/accumulation.get.ts', path: '/api/runs/[id]/accumulation', allowed: [...everyone], params: { id: 'runId' } },
  { method: 'GET', file: 'server/api/runs/[id]/sites/index.get.ts', path: '/api/runs/[id]/sites', allowed: [...everyone], params: { id: 'runId' } },
  { method: 'GET', file: 'server/api/runs/[id]/sites/[siteId].get.ts', path: '/api/runs/[id]/sites/[siteId]', allowed: [...everyone], params: { id: 'runId', siteId: 'siteIdOfRun' } },
)

rules.push(
  { method: 'GET', file: 'server/api/runs/[id]/export.get.ts', path: '/api/runs/[id]/export', allowed: ['admin', 'analyst', 'underwriter', 'asset_manager'], params: { id: 'runId' } },
)

rules.push(
  { method: 'GET', file: 'server/api/runs/compare.get.ts', path: '/api/runs/compare', allowed: ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer'] },
)
