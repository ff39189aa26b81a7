// Scenario evaluations: freeze each touched site and its scenarios, queue one 'scenario.site' job
// per site, and store each site's paired figures as its job finishes.
import { randomInt } from 'node:crypto'
import { and, eq, inArray, sql } from 'drizzle-orm'
import { parseAssumptions } from '../../shared/engine/assumptions'
import type { SiteInput } from '../../shared/engine/types'
import type { PairedResult } from '../../shared/capital/paired'
import { useDb } from '../db'
import { assumptionSets, assumptionSetVersions, capitalEvaluations, capitalEvaluationSites, capitalPlans, capitalScenarioResults, sites } from '../db/schema'
import { withClientTransaction } from '../db/transaction'
import { queueOptions, useBoss } from '../jobs/queue'
import { snapshotSites } from '../runs/snapshot'
import { computeScenariosOnThread } from './threads'
import { listActions } from './catalogue'
import type { ScenarioSpec } from './scenario-task'
import { recordAudit } from '../utils/audit'
import { AppError } from '../utils/errors'

export interface StartEvaluation { assumptionVersionId: string, seed?: number, samplesPerTank: number, planId?: string }

/** Key of a bundle: the site's chosen actions measured together. */
export const bundleKey = (siteId: string) => `bundle:${siteId}`

export async function startEvaluation(input: StartEvaluation, by: { userId: string | null, organisationId: string, via?: string | null }) {
  const db = useDb()
  const [version] = await db.select({ v: assumptionSetVersions, setName: assumptionSets.name, archivedAt: assumptionSets.archivedAt }).from(assumptionSetVersions)
    .innerJoin(assumptionSets, eq(assumptionSets.id, assumptionSetVersions.assumptionSetId))
    .where(and(eq(assumptionSetVersions.id, input.assumptionVersionId), eq(assumptionSets.organisationId, by.organisationId)))
  if (!version) throw new AppError(404, 'Assumption-set version not found.')
  if (version.archivedAt) throw new AppError(409, `The assumption set "${version.setName}" is archived. Restore it or choose another set.`)
  let actionIds: string[] | undefined
  if (input.planId) {
    const [plan] = await db.select().from(capitalPlans).where(and(eq(capitalPlans.id, input.planId), eq(capitalPlans.organisationId, by.organisationId)))
    if (!plan) throw new AppError(404, 'Plan not found.')
    actionIds = plan.actionIds
  }
  const actions = await listActions(db, by.organisationId, actionIds)
  if (actions.length === 0) throw new AppError(400, 'There are no candidate actions to evaluate. Add actions first.')
  const assumptions = parseAssumptions(version.v.parameters)
  const siteIds = [...new Set(actions.map(a => a.siteId))]
  const siteRows = await db.select().from(sites).where(and(eq(sites.organisationId, by.organisationId), inArray(sites.id, siteIds)))
  const snapshots = await snapshotSites(db, siteRows, assumptions)

  const perSite = snapshots.map(({ site }) => {
    const mine = actions.filter(a => a.siteId === site.id)
    const scenarios: ScenarioSpec[] = mine.map(a => ({ key: a.id, actionIds: [a.id], actions: [a.effect] }))
    // Actions chosen together on one site are measured together too (a shield and a mast interact).
    if (input.planId && mine.length > 1) scenarios.push({ key: bundleKey(site.id), actionIds: mine.map(a => a.id), actions: mine.map(a => a.effect) })
    return { site, scenarios }
  })
  const seed = input.seed ?? randomInt(0, 2 ** 31)
  const boss = await useBoss()
  return withClientTransaction(async ({ tx, bossDb }) => {
    const [evaluation] = await tx.insert(capitalEvaluations).values({
      organisationId: by.organisationId, assumptionVersionId: version.v.id, planId: input.planId ?? null,
      seed, samplesPerTank: input.samplesPerTank, sitesTotal: perSite.length, requestedBy: by.userId,
    }).returning()
    const evaluationId = evaluation!.id
    await tx.insert(capitalEvaluationSites).values(perSite.map(p => ({ evaluationId, siteId: p.site.id, siteName: p.site.name, site: p.site, scenarios: p.scenarios })))
    await tx.update(assumptionSetVersions).set({ usedByRun: true }).where(eq(assumptionSetVersions.id, version.v.id))
    await boss.insert(perSite.map(p => ({
      name: 'scenario.site', data: { evaluationId, siteId: p.site.id }, singletonKey: `${evaluationId}:${p.site.id}`,
      ...queueOptions['scenario.site'],
    })), { db: bossDb })
    await recordAudit({
      organisationId: by.organisationId, userId: by.userId, action: 'create', entity: 'capital_evaluation', entityId: evaluationId,
      after: { actions: actions.length, sites: perSite.length, seed, samplesPerTank: input.samplesPerTank, plan: input.planId ?? null },
    }, { tx, via: by.via })
    return evaluation!
  })
}

/** Works one site of an evaluation; idempotent (a site already done is skipped). */
export async function workScenarioSite(evaluationId: string, siteId: string): Promise<'skipped' | 'stored'> {
  const db = useDb()
  const [evaluation] = await db.select().from(capitalEvaluations).where(eq(capitalEvaluations.id, evaluationId))
  if (!evaluation || !['queued', 'running'].includes(evaluation.state)) return 'skipped'
  const [row] = await db.select().from(capitalEvaluationSites).where(and(eq(capitalEvaluationSites.evaluationId, evaluationId), eq(capitalEvaluationSites.siteId, siteId)))
  if (!row || row.done === 1) return 'skipped'
  if (evaluation.state === 'queued') await db.update(capitalEvaluations).set({ state: 'running' }).where(and(eq(capitalEvaluations.id, evaluationId), eq(capitalEvaluations.state, 'queued')))
  const [version] = await db.select().from(assumptionSetVersions).where(eq(assumptionSetVersions.id, evaluation.assumptionVersionId))
  const scenarios = row.scenarios as ScenarioSpec[]
  const result = await computeScenariosOnThread({
    site: row.site as SiteInput, scenarios, assumptions: parseAssumptions(version!.parameters), seed: evaluation.seed, samplesPerTank: evaluation.samplesPerTank,
  })
  await db.transaction(async (tx) => {
    const [claimed] = await tx.update(capitalEvaluationSites).set({ done: 1 })
      .where(and(eq(capitalEvaluationSites.evaluationId, evaluationId), eq(capitalEvaluationSites.siteId, siteId), eq(capitalEvaluationSites.done, 0)))
      .returning({ siteId: capitalEvaluationSites.siteId })
    if (!claimed) return
    await tx.insert(capitalScenarioResults).values(resultRows(evaluationId, siteId, scenarios, result))
    const [updated] = await tx.update(capitalEvaluations).set({ sitesDone: sql`${capitalEvaluations.sitesDone} + 1` })
      .where(eq(capitalEvaluations.id, evaluationId)).returning()
    if (updated && updated.sitesDone >= updated.sitesTotal) {
      await tx.update(capitalEvaluations).set({ state: 'succeeded', finishedAt: new Date() }).where(eq(capitalEvaluations.id, evaluationId))
    }
  })
  return 'stored'
}

function resultRows(evaluationId: string, siteId: string, scenarios: ScenarioSpec[], result: PairedResult) {
  return result.scenarios.map((s) => {
    const spec = scenarios.find(x => x.key === s.key)!
    return {
      evaluationId, siteId, key: s.key, actionIds: spec.actionIds,
      figures: { site: s.site, tanks: s.tanks, samplesPerTank: result.samplesPerTank },
      reductionIgnition: s.site.ignition.reduction.rate, reductionLoss: s.site.loss.reduction.rate,
    }
  })
}

export async function failEvaluation(evaluationId: string, message: string): Promise<void> {
  await useDb().update(capitalEvaluations).set({ state: 'failed', error: message, finishedAt: new Date() })
    .where(and(eq(capitalEvaluations.id, evaluationId), inArray(capitalEvaluations.state, ['queued', 'running'])))
}
