// Reading runs for the API: progress with elapsed and estimated time left, and the results of
// succeeded runs only (a failed or cancelled run shows no result).
import { and, desc, eq } from 'drizzle-orm'
import { useDb } from '../db'
import { assumptionSets, assumptionSetVersions, runPortfolioResults, runs, users } from '../db/schema'

type RunRow = typeof runs.$inferSelect

export interface RunProgress {
  sitesDone: number
  sitesTotal: number
  share: number
  elapsedSeconds: number | null
  /** Linear from the pace so far; null before the first chunk is in. */
  remainingSeconds: number | null
}

export function progressOf(run: RunRow, now = new Date()): RunProgress {
  const started = run.startedAt?.getTime() ?? null
  const end = run.finishedAt?.getTime() ?? now.getTime()
  const elapsed = started === null ? null : Math.max(0, (end - started) / 1000)
  const share = run.sitesTotal > 0 ? run.sitesDone / run.sitesTotal : 0
  const open = run.state === 'queued' || run.state === 'running'
  const remaining = open && elapsed !== null && run.sitesDone > 0 ? elapsed * (run.sitesTotal - run.sitesDone) / run.sitesDone : null
  return { sitesDone: run.sitesDone, sitesTotal: run.sitesTotal, share, elapsedSeconds: elapsed, remainingSeconds: remaining }
}

const runColumns = { run: runs, requestedByName: users.name, setName: assumptionSets.name, version: assumptionSetVersions.version }

export async function listRuns(organisationId: string, portfolioId?: string) {
  const rows = await useDb().select(runColumns).from(runs)
    .leftJoin(users, eq(users.id, runs.requestedBy))
    .innerJoin(assumptionSetVersions, eq(assumptionSetVersions.id, runs.assumptionVersionId))
    .innerJoin(assumptionSets, eq(assumptionSets.id, assumptionSetVersions.assumptionSetId))
    .where(portfolioId ? and(eq(runs.organisationId, organisationId), eq(runs.portfolioId, portfolioId)) : eq(runs.organisationId, organisationId))
    .orderBy(desc(runs.createdAt)).limit(200)
  return rows.map(present)
}

export async function getRun(organisationId: string, runId: string) {
  const [row] = await useDb().select(runColumns).from(runs)
    .leftJoin(users, eq(users.id, runs.requestedBy))
    .innerJoin(assumptionSetVersions, eq(assumptionSetVersions.id, runs.assumptionVersionId))
    .innerJoin(assumptionSets, eq(assumptionSets.id, assumptionSetVersions.assumptionSetId))
    .where(and(eq(runs.id, runId), eq(runs.organisationId, organisationId)))
  if (!row) return null
  const [portfolio] = row.run.state === 'succeeded'
    ? await useDb().select().from(runPortfolioResults).where(eq(runPortfolioResults.runId, runId))
    : []
  return { ...present(row), results: portfolio ?? null }
}

function present(row: { run: RunRow, requestedByName: string | null, setName: string, version: number }) {
  const { run } = row
  return {
    id: run.id, state: run.state, mode: run.mode, seed: run.seed,
    portfolioId: run.portfolioId, portfolioName: run.portfolioName,
    name: run.name || run.portfolioName, isReference: run.isReference,
    assumptions: { versionId: run.assumptionVersionId, setName: row.setName, version: row.version },
    targetRse: run.targetRse, years: run.years, maxSamplesPerTank: run.maxSamplesPerTank, chunkSize: run.chunkSize,
    negligibleRatePerYear: run.negligibleRatePerYear, stormClustering: run.stormClustering, clusteringFrame: run.clusteringFrame,
    assumptionDraws: run.assumptionDraws,
    tanksTotal: run.tanksTotal, chunksTotal: run.chunksTotal, chunksDone: run.chunksDone,
    inputHash: run.inputHash, engineVersion: run.engineVersion, errorMessage: run.errorMessage,
    requestedBy: row.requestedByName, retryOf: run.retryOf,
    createdAt: run.createdAt, startedAt: run.startedAt, finishedAt: run.finishedAt,
    progress: progressOf(run),
  }
}
