// From an evaluation's figures to a plan: ranking, the best plan under a budget, the frontier.
import { and, desc, eq, isNull } from 'drizzle-orm'
import { bestPlan, rankItems, reductionPerCost } from '../../shared/capital/knapsack'
import { hasModelEffect, NO_EFFECT_REASON } from '../../shared/capital/actions'
import type { MetricFigures } from '../../shared/capital/paired'
import type { Database } from '../db'
import { capitalEvaluations, capitalScenarioResults } from '../db/schema'
import { listActions, type ActionRow } from './catalogue'

export type PlanMetric = 'loss' | 'ignition'

export interface RankedAction extends ActionRow {
  figures: MetricFigures | null
  /** The reduction the plan counts (metric), null before an evaluation measured it. */
  value: number | null
  perCost: number | null
  rank: number | null
  noEffectReason: string | null
}

/** The latest finished evaluation of every single action (not a plan's bundles). */
export async function latestEvaluation(db: Database, organisationId: string) {
  const [row] = await db.select().from(capitalEvaluations)
    .where(and(eq(capitalEvaluations.organisationId, organisationId), eq(capitalEvaluations.state, 'succeeded'), isNull(capitalEvaluations.planId)))
    .orderBy(desc(capitalEvaluations.createdAt)).limit(1)
  return row ?? null
}

export async function rankedActions(db: Database, organisationId: string, metric: PlanMetric) {
  const [actions, evaluation] = await Promise.all([listActions(db, organisationId), latestEvaluation(db, organisationId)])
  const results = evaluation ? await db.select().from(capitalScenarioResults).where(eq(capitalScenarioResults.evaluationId, evaluation.id)) : []
  const byKey = new Map(results.map(r => [r.key, r]))
  const rows: RankedAction[] = actions.map(({ effect: _effect, ...a }) => {
    const r = byKey.get(a.id)
    const figures = r ? (r.figures as { site: MetricFigures }).site : null
    const value = r ? (metric === 'loss' ? r.reductionLoss : r.reductionIgnition) : null
    return { ...a, figures, value, perCost: value === null ? null : reductionPerCost(value, a.cost), rank: null, noEffectReason: hasModelEffect(a.kind) ? null : NO_EFFECT_REASON }
  })
  const measured = rows.filter(r => r.value !== null)
  rankItems(measured.map(r => ({ id: r.id, cost: r.cost, value: r.value! }))).forEach((item, i) => { rows.find(r => r.id === item.id)!.rank = i + 1 })
  return { evaluation, actions: rows }
}

export async function planForBudget(db: Database, organisationId: string, budget: number, metric: PlanMetric) {
  const { evaluation, actions } = await rankedActions(db, organisationId, metric)
  const items = actions.filter(a => a.value !== null).map(a => ({ id: a.id, cost: a.cost, value: a.value! }))
  const started = performance.now()
  const plan = bestPlan(items, budget)
  const positiveCost = items.filter(i => i.value > 0).reduce((n, i) => n + i.cost, 0)
  const frontier = bestPlan(items, Math.max(budget, positiveCost)).frontier
  return {
    evaluation, metric, budget, actions,
    plan: { ...plan, frontier: undefined, milliseconds: Math.round(performance.now() - started) },
    frontier: thin(frontier, 400),
    unmeasured: actions.length - items.length,
  }
}

/** At most `max` frontier points, always keeping the first and the last. */
function thin<T>(points: T[], max: number): T[] {
  if (points.length <= max) return points
  const step = (points.length - 1) / (max - 1)
  return Array.from({ length: max }, (_, i) => points[Math.round(i * step)]!)
}
