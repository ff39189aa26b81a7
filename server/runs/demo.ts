// The demo's first runs, queued right after the demo scenario is seeded so results are there to explore.
import { asc, eq } from 'drizzle-orm'
import { useDb } from '../db'
import { assumptionSets, assumptionSetVersions, organisations, portfolios, portfolioSites } from '../db/schema'
import { startRun } from './start'

/** Demo seeds: fixed so that every fresh demo shows the same figures. */
const DEMO_SEED = 20261202

/** One run per organisation that owns a portfolio with sites: year mode (it gives exceedance curves). */
export async function queueDemoRuns(): Promise<string[]> {
  const db = useDb()
  const rows = await db.selectDistinctOn([portfolios.organisationId], { portfolioId: portfolios.id, organisationId: portfolios.organisationId, orgName: organisations.name })
    .from(portfolios)
    .innerJoin(portfolioSites, eq(portfolioSites.portfolioId, portfolios.id))
    .innerJoin(organisations, eq(organisations.id, portfolios.organisationId))
    .orderBy(portfolios.organisationId, asc(portfolios.name))
  const started: string[] = []
  for (const row of rows) {
    const [version] = await db.select({ id: assumptionSetVersions.id }).from(assumptionSetVersions)
      .innerJoin(assumptionSets, eq(assumptionSets.id, assumptionSetVersions.assumptionSetId))
      .where(eq(assumptionSets.organisationId, row.organisationId)).orderBy(asc(assumptionSetVersions.createdAt)).limit(1)
    if (!version) continue
    const run = await startRun({
      portfolioId: row.portfolioId, assumptionVersionId: version.id, mode: 'year', seed: DEMO_SEED,
      targetRse: 0.02, maxSamplesPerTank: 400_000, negligibleRatePerYear: 1e-5, years: 10_000, chunkSize: 10, stormClustering: false, assumptionDraws: 0,
    }, { userId: null, organisationId: row.organisationId })
    started.push(run.id)
  }
  return started
}
