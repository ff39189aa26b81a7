// Role rules for saved what-if options (README "Reading results": every member reads them; everyone
// but viewers saves and removes them; sending one to the capital plan is the capital plan's rule).
import type pg from 'pg'
import type { RouteRule } from './types'

const everyone = ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer'] as const
const contributors = ['admin', 'analyst', 'underwriter', 'asset_manager'] as const
const planners = ['admin', 'asset_manager'] as const

export const rules: RouteRule[] = [
  { method: 'GET', file: 'server/api/whatif-options/index.get.ts', path: '/api/whatif-options', allowed: [...everyone] },
  { method: 'POST', file: 'server/api/whatif-options/index.post.ts', path: '/api/whatif-options', allowed: [...contributors] },
  { method: 'DELETE', file: 'server/api/whatif-options/[id].delete.ts', path: '/api/whatif-options/[id]', allowed: [...contributors], params: { id: 'whatIfOptionId' } },
  { method: 'POST', file: 'server/api/whatif-options/[id]/send.post.ts', path: '/api/whatif-options/[id]/send', allowed: [...planners], params: { id: 'whatIfOptionId' }, body: { optionId: '00000000-0000-4000-8000-000000000000' } },
]

export async function fixtures(pool: pg.Pool, organisationId: string): Promise<Record<string, string>> {
  const { rows: [row] } = await pool.query(
    `INSERT INTO whatif_options (organisation_id, label, params, changes, figures, engine_version)
     VALUES ($1, 'Matrix option', '{"flashDensity":4,"tankHeightM":7.3,"tankDiameterM":4.6,"u50Kv":70,"sigma":0.3,"shieldKa":60,"mastHeightM":0,"mastDistanceM":15,"currentLaw":"power_law"}',
       '[]', '{"sparkingPerYear":0.01,"directPerYear":0.001,"ignitionPerYear":0.002}', 'test') RETURNING id`, [organisationId])
  return { whatIfOptionId: row.id }
}
