// One saved plan with its actions' figures and, where a plan evaluation measured them, each site's bundle.
import { and, desc, eq } from 'drizzle-orm'
import type { MetricFigures } from '../../shared/capital/paired'
import type { Database } from '../db'
import { capitalEvaluations, capitalPlans, capitalScenarioResults } from '../db/schema'
import { listActions } from './catalogue'
import { bundleKey } from './evaluations'

export async function planDetail(db: Database, organisationId: string, planId: string) {
  const [plan] = await db.select().from(capitalPlans).where(and(eq(capitalPlans.id, planId), eq(capitalPlans.organisationId, organisationId)))
  if (!plan) return null
  const actions = await listActions(db, organisationId, plan.actionIds)
  const singles = plan.evaluationId ? await db.select().from(capitalScenarioResults).where(eq(capitalScenarioResults.evaluationId, plan.evaluationId)) : []
  const [check] = await db.select().from(capitalEvaluations)
    .where(and(eq(capitalEvaluations.planId, planId), eq(capitalEvaluations.state, 'succeeded'))).orderBy(desc(capitalEvaluations.createdAt)).limit(1)
  const together = check ? await db.select().from(capitalScenarioResults).where(eq(capitalScenarioResults.evaluationId, check.id)) : []
  const bySingle = new Map(singles.map(r => [r.key, (r.figures as { site: MetricFigures }).site]))
  const siteIds = [...new Set(actions.map(a => a.siteId))]
  const sites = siteIds.map((siteId) => {
    const mine = actions.filter(a => a.siteId === siteId)
    const measured = together.find(r => r.key === (mine.length > 1 ? bundleKey(siteId) : mine[0]!.id))
    return { siteId, siteName: mine[0]!.siteName, actionIds: mine.map(a => a.id), together: measured ? (measured.figures as { site: MetricFigures }).site : null }
  })
  return {
    plan,
    actions: actions.map(({ effect: _e, ...a }) => ({ ...a, figures: bySingle.get(a.id) ?? null })),
    sites,
    planEvaluation: check ?? null,
  }
}
