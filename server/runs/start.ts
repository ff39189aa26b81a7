// Starting a run: freeze the inventory and assumptions, split into chunks, queue the chunks — all in
// one transaction, so a run is never half-created and never created without its jobs.
import { randomInt } from 'node:crypto'
import { and, eq } from 'drizzle-orm'
import { ENGINE_VERSION } from '../../shared/engine'
import { EngineInputError, parseAssumptions } from '../../shared/engine/assumptions'
import { planAssumptionDraws } from '../../shared/engine/draws'
import type { z } from 'zod'
import { defaultRunName, type startRunSchema } from '../../shared/schemas/runs'
import { useDb } from '../db'
import { assumptionSets, assumptionSetVersions, runChunks, runs, runSiteSnapshots } from '../db/schema'
import { withClientTransaction } from '../db/transaction'
import { queueOptions, useBoss } from '../jobs/queue'
import { recordAudit } from '../utils/audit'
import { AppError } from '../utils/errors'
import { recordRunTerms } from '../insurance/terms-store'
import { readablePortfolio } from '../inventory/portfolio-access'
import { decidingAssumptions, inputHash, loadPortfolioSites } from './snapshot'
import { clusteringFrame } from '../../shared/engine/storm-clusters'

export type StartRun = z.output<typeof startRunSchema>

export async function startRun(input: StartRun, by: { userId: string | null, organisationId: string, via?: string | null }, options: { retryOf?: string } = {}) {
  const db = useDb()
  const readable = await readablePortfolio(by.organisationId, input.portfolioId)
  if (!readable) throw new AppError(404, 'Portfolio not found.')
  const portfolio = readable.portfolio
  const [version] = await db.select({ v: assumptionSetVersions, setName: assumptionSets.name, archivedAt: assumptionSets.archivedAt }).from(assumptionSetVersions)
    .innerJoin(assumptionSets, eq(assumptionSets.id, assumptionSetVersions.assumptionSetId))
    .where(and(eq(assumptionSetVersions.id, input.assumptionVersionId), eq(assumptionSets.organisationId, by.organisationId)))
  if (!version) throw new AppError(404, 'Assumption-set version not found.')
  if (version.archivedAt) throw new AppError(409, `The assumption set "${version.setName}" is archived. Restore it (Assumptions → Show archived) or choose another set.`)
  const assumptions = parseAssumptions(version.v.parameters)
  const snapshot = await loadPortfolioSites(db, portfolio.id, assumptions)
  if (snapshot.length === 0) throw new AppError(400, `Portfolio "${portfolio.name}" has no sites to simulate. Add sites first.`)

  const seed = input.seed ?? randomInt(0, 2 ** 31)
  // Storm clustering belongs to simulated years; its frame is fixed here, from every site of the run.
  const stormClustering = input.mode === 'year' && input.stormClustering
  const frame = stormClustering
    ? clusteringFrame(snapshot.map(s => ({ latitudeDeg: s.facts.latitudeDeg, longitudeDeg: s.facts.longitudeDeg, flashDensity: s.site.flashDensity })))
    : null
  if (input.assumptionDraws > 0) {
    // Refuse at the start what the draws cannot take (paths, correlations), with the engine's reasons.
    let drawnPaths: string[] = []
    try { drawnPaths = planAssumptionDraws(assumptions, { draws: input.assumptionDraws, runSeed: seed }).entries.map(e => e.path) } catch (error) {
      // (illustrative ranges on assumptions the draws cannot carry are left out, not refused: the plan reports them)
      if (error instanceof EngineInputError) throw new AppError(400, `Assumption draws: ${error.issues.join('; ')}`)
      throw error
    }
    // Simulated years with storm clustering: the storm field is fixed at the central densities, so a drawn flash density has no storms to come from.
    if (stormClustering && drawnPaths.includes('flashDensityFactor')) {
      throw new AppError(400, 'Assumption draws with storm clustering: the flash-density factor cannot be uncertain (the storm field is fixed at the central densities). Remove its uncertainty or run without clustering.')
    }
  }
  const hash = inputHash({
    ...(stormClustering ? { stormClustering: frame! } : {}),
    engineVersion: ENGINE_VERSION, assumptions: decidingAssumptions(assumptions, { assumptionDraws: input.assumptionDraws, stormClustering }),
    mode: input.mode, seed, targetRse: input.targetRse, maxSamplesPerTank: input.maxSamplesPerTank, negligibleRatePerYear: input.negligibleRatePerYear, years: input.years, ...(input.assumptionDraws > 0 ? { assumptionDraws: input.assumptionDraws } : {}), sites: snapshot.map(s => s.site),
  })
  const chunks: string[][] = []
  for (let i = 0; i < snapshot.length; i += input.chunkSize) chunks.push(snapshot.slice(i, i + input.chunkSize).map(s => s.site.id))
  const boss = await useBoss()

  return withClientTransaction(async ({ tx, bossDb }) => {
    const [run] = await tx.insert(runs).values({
      organisationId: by.organisationId, portfolioId: portfolio.id, portfolioName: portfolio.name,
      name: input.name?.trim() || defaultRunName(portfolio.name, new Date()),
      assumptionVersionId: version.v.id, mode: input.mode, seed,
      targetRse: input.targetRse, maxSamplesPerTank: input.maxSamplesPerTank, negligibleRatePerYear: input.negligibleRatePerYear,
      years: input.years, assumptionDraws: input.assumptionDraws, chunkSize: input.chunkSize, stormClustering, clusteringFrame: frame,
      sitesTotal: snapshot.length, tanksTotal: snapshot.reduce((n, s) => n + s.site.tanks.length, 0), chunksTotal: chunks.length,
      inputHash: hash, engineVersion: ENGINE_VERSION, requestedBy: by.userId, retryOf: options.retryOf ?? null,
    }).returning()
    const runId = run!.id
    for (let i = 0; i < snapshot.length; i += 500) {
      await tx.insert(runSiteSnapshots).values(snapshot.slice(i, i + 500).map((s, k) => ({ runId, siteId: s.site.id, position: i + k, site: s.site, facts: s.facts })))
    }
    await tx.insert(runChunks).values(chunks.map((siteIds, chunkIndex) => ({ runId, chunkIndex, siteIds })))
    // A version that a run has used is frozen: editing it makes a new version.
    await tx.update(assumptionSetVersions).set({ usedByRun: true }).where(eq(assumptionSetVersions.id, version.v.id))
    // The portfolio's current policy terms, if any, are recorded and frozen the same way.
    await recordRunTerms(tx, runId, by.organisationId, portfolio.id)
    await boss.insert(chunks.map((_, chunkIndex) => ({
      name: 'run.chunk', data: { runId, chunkIndex }, singletonKey: `${runId}:${chunkIndex}`,
      ...queueOptions['run.chunk'],
    })), { db: bossDb })
    await recordAudit({
      organisationId: by.organisationId, userId: by.userId, action: 'create', entity: 'run', entityId: runId,
      after: { portfolio: portfolio.name, assumptions: `${version.setName} v${version.v.version}`, mode: input.mode, seed, sites: snapshot.length, ...(stormClustering ? { stormClustering: true } : {}) },
    }, { tx, via: by.via })
    return run!
  })
}
