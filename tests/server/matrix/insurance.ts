// Role rules for policy terms and the financial view (issue 10: underwriters and admins edit terms;
// every member reads; exports for every role but viewers, as other workbooks).
import type pg from 'pg'
import { defaultAssumptions } from '../../../shared/engine/assumptions'
import { createDefaultAssumptions, createFleet } from '../../support/fleet'
import type { RouteRule } from './types'

const everyone = ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer'] as const
const underwriting = ['admin', 'underwriter'] as const
const exporters = ['admin', 'analyst', 'underwriter', 'asset_manager'] as const

export const rules: RouteRule[] = [
  { method: 'GET', file: 'server/api/policy-terms/index.get.ts', path: '/api/policy-terms', allowed: [...everyone] },
  { method: 'POST', file: 'server/api/policy-terms/index.post.ts', path: '/api/policy-terms', allowed: [...underwriting] },
  { method: 'GET', file: 'server/api/policy-terms/[id].get.ts', path: '/api/policy-terms/[id]', allowed: [...everyone], params: { id: 'termsSetId' } },
  { method: 'POST', file: 'server/api/policy-terms/[id]/archive.post.ts', path: '/api/policy-terms/[id]/archive', allowed: [...underwriting], params: { id: 'termsSetId' } },
  { method: 'DELETE', file: 'server/api/policy-terms/[id].delete.ts', path: '/api/policy-terms/[id]', allowed: [...underwriting], params: { id: 'termsSetId' } },
  { method: 'GET', file: 'server/api/policy-terms-versions/[id].get.ts', path: '/api/policy-terms-versions/[id]', allowed: [...everyone], params: { id: 'termsVersionId' } },
  { method: 'PUT', file: 'server/api/policy-terms-versions/[id].put.ts', path: '/api/policy-terms-versions/[id]', allowed: [...underwriting], params: { id: 'termsVersionId' }, body: { note: '', sites: [] } },
  { method: 'GET', file: 'server/api/runs/[id]/financial.get.ts', path: '/api/runs/[id]/financial', allowed: [...everyone], params: { id: 'termsRunId' } },
  { method: 'GET', file: 'server/api/runs/[id]/financial-workbook.get.ts', path: '/api/runs/[id]/financial-workbook', allowed: [...exporters], params: { id: 'termsRunId' } },
]

/** A portfolio with a terms set (version 1, one site row) and a succeeded simulated-years run with no events. */
export async function fixtures(pool: pg.Pool, organisationId: string): Promise<Record<string, string>> {
  const assumptionVersionId = await createDefaultAssumptions(pool, organisationId, defaultAssumptions)
  const portfolioId = await createFleet(pool, organisationId, { sites: 1, tanksPerSite: 1, seed: 'terms-matrix' })
  const { rows: [site] } = await pool.query(`SELECT site_id FROM portfolio_sites WHERE portfolio_id = $1`, [portfolioId])
  const { rows: [set] } = await pool.query(`INSERT INTO policy_terms_sets (organisation_id, portfolio_id, name) VALUES ($1, $2, 'Matrix terms') RETURNING id`, [organisationId, portfolioId])
  const { rows: [version] } = await pool.query(`INSERT INTO policy_terms_versions (terms_set_id, version) VALUES ($1, 1) RETURNING id`, [set.id])
  await pool.query(`INSERT INTO policy_site_terms (version_id, site_id, occurrence_deductible, share) VALUES ($1, $2, 1000, 0.5)`, [version.id, site.site_id])
  const { rows: [run] } = await pool.query(
    `INSERT INTO runs (organisation_id, portfolio_id, portfolio_name, assumption_version_id, mode, seed, target_rse, max_samples_per_tank, years,
      chunk_size, sites_total, tanks_total, chunks_total, input_hash, engine_version, state)
     VALUES ($1, $2, 'Matrix fleet', $3, 'year', 1, 0.2, 4000, 1000, 1, 1, 1, 1, 'x', 'test', 'succeeded') RETURNING id`,
    [organisationId, portfolioId, assumptionVersionId])
  return { termsSetId: set.id, termsVersionId: version.id, termsRunId: run.id }
}
