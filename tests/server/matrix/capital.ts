// Role rules for capital planning (PRODUCT.md: asset managers and admins build plans; analysts and
// admins run scenario evaluations; everyone reads; viewers do not export).
import type pg from 'pg'
import { defaultAssumptions } from '../../../shared/engine/assumptions'
import { createDefaultAssumptions, createFleet } from '../../support/fleet'
import type { RouteRule } from './types'

const everyone = ['admin', 'analyst', 'underwriter', 'asset_manager', 'viewer'] as const
const planners = ['admin', 'asset_manager'] as const
const editors = ['admin', 'analyst'] as const
const exporters = ['admin', 'analyst', 'underwriter', 'asset_manager'] as const

export const rules: RouteRule[] = [
  { method: 'GET', file: 'server/api/capital/options/index.get.ts', path: '/api/capital/options', allowed: [...everyone] },
  { method: 'POST', file: 'server/api/capital/options/index.post.ts', path: '/api/capital/options', allowed: [...planners] },
  { method: 'PATCH', file: 'server/api/capital/options/[id].patch.ts', path: '/api/capital/options/[id]', allowed: [...planners], params: { id: 'optionId' }, body: { fixedCost: 1000 } },
  { method: 'POST', file: 'server/api/capital/options/[id]/archive.post.ts', path: '/api/capital/options/[id]/archive', allowed: [...planners], params: { id: 'optionId' } },
  { method: 'DELETE', file: 'server/api/capital/options/[id].delete.ts', path: '/api/capital/options/[id]', allowed: [...planners], params: { id: 'optionId' } },
  { method: 'GET', file: 'server/api/capital/actions/index.get.ts', path: '/api/capital/actions', allowed: [...everyone] },
  { method: 'POST', file: 'server/api/capital/actions/index.post.ts', path: '/api/capital/actions', allowed: [...planners] },
  { method: 'DELETE', file: 'server/api/capital/actions/[id].delete.ts', path: '/api/capital/actions/[id]', allowed: [...planners], params: { id: 'actionId' } },
  { method: 'GET', file: 'server/api/capital/evaluations/index.get.ts', path: '/api/capital/evaluations', allowed: [...everyone] },
  { method: 'POST', file: 'server/api/capital/evaluations/index.post.ts', path: '/api/capital/evaluations', allowed: [...editors] },
  { method: 'GET', file: 'server/api/capital/evaluations/[id].get.ts', path: '/api/capital/evaluations/[id]', allowed: [...everyone], params: { id: 'evaluationId' } },
  { method: 'GET', file: 'server/api/capital/best-plan.get.ts', path: '/api/capital/best-plan', allowed: [...everyone] },
  { method: 'GET', file: 'server/api/capital/plans/index.get.ts', path: '/api/capital/plans', allowed: [...everyone] },
  { method: 'POST', file: 'server/api/capital/plans/index.post.ts', path: '/api/capital/plans', allowed: [...planners] },
  { method: 'GET', file: 'server/api/capital/plans/[id].get.ts', path: '/api/capital/plans/[id]', allowed: [...everyone], params: { id: 'planId' } },
  { method: 'DELETE', file: 'server/api/capital/plans/[id].delete.ts', path: '/api/capital/plans/[id]', allowed: [...planners], params: { id: 'planId' } },
  { method: 'GET', file: 'server/api/capital/plans/[id]/export.get.ts', path: '/api/capital/plans/[id]/export', allowed: [...exporters], params: { id: 'planId' } },
]

/** An option, an action on a generated tank, a finished evaluation and a saved plan in the organisation. */
export async function fixtures(pool: pg.Pool, organisationId: string): Promise<Record<string, string>> {
  const assumptionVersionId = await createDefaultAssumptions(pool, organisationId, defaultAssumptions)
  const portfolioId = await createFleet(pool, organisationId, { sites: 1, tanksPerSite: 1, seed: 'capital-matrix' })
  const { rows: [tank] } = await pool.query(`SELECT t.id, t.site_id FROM tanks t JOIN portfolio_sites ps ON ps.site_id = t.site_id WHERE ps.portfolio_id = $1 LIMIT 1`, [portfolioId])
  const { rows: [option] } = await pool.query(`INSERT INTO mitigation_options (organisation_id, kind, name, shield_rating_ka, fixed_cost) VALUES ($1, 'shield', 'Matrix shield', 150, 1000) RETURNING id`, [organisationId])
  const { rows: [action] } = await pool.query(`INSERT INTO capital_actions (organisation_id, option_id, site_id, tank_id, cost) VALUES ($1, $2, $3, $4, 1000) RETURNING id`, [organisationId, option.id, tank.site_id, tank.id])
  const { rows: [evaluation] } = await pool.query(
    `INSERT INTO capital_evaluations (organisation_id, assumption_version_id, seed, samples_per_tank, state, sites_total, sites_done) VALUES ($1, $2, 1, 1000, 'succeeded', 1, 1) RETURNING id`,
    [organisationId, assumptionVersionId])
  const { rows: [plan] } = await pool.query(
    `INSERT INTO capital_plans (organisation_id, name, budget, metric, evaluation_id, action_ids, total_cost, reduction) VALUES ($1, 'Matrix plan', 5000, 'loss', $2, $3, 1000, 1) RETURNING id`,
    [organisationId, evaluation.id, JSON.stringify([action.id])])
  return { optionId: option.id, actionId: action.id, evaluationId: evaluation.id, planId: plan.id }
}
