// Works one chunk of a run: compute its sites on the thread pool, store them, finalise if last.
import { and, asc, eq, inArray, sql } from 'drizzle-orm'
import { hostname } from 'node:os'
import { parseAssumptions } from '../../shared/engine/assumptions'
import { ENGINE_VERSION } from '../../shared/engine'
import { siteClustering } from '../../shared/engine/storm-clusters'
import { useDb } from '../db'
import { assumptionSetVersions, runChunks, runs, runSiteSnapshots } from '../db/schema'
import type { SiteComputation } from './compute'
import { endRunUnsuccessfully, notifyRunEnded } from './ending'
import { finaliseRun } from './finalise'
import { storeRunDocuments } from '../results/documents'
import { storeChunk } from './store'
import { computeOnThread } from './thread-pool'
import { epochMs, threadTransfer, type ChunkTiming } from './timing'

export class SiteComputationError extends Error {}

const workerName = `${hostname()}:${process.pid}`

export type ChunkOutcome = 'skipped' | 'stored' | 'duplicate' | 'finalised'

/** `queuedAt`: when the chunk's job was queued (epoch ms), for the run's phase breakdown. */
export async function workChunk(runId: string, chunkIndex: number, queuedAt: number | null = null): Promise<ChunkOutcome> {
  const pickedUpAt = epochMs()
  const db = useDb()
  const [run] = await db.select().from(runs).where(eq(runs.id, runId))
  if (!run || !['queued', 'running'].includes(run.state)) return 'skipped'
  const [chunk] = await db.select().from(runChunks).where(and(eq(runChunks.runId, runId), eq(runChunks.chunkIndex, chunkIndex)))
  if (!chunk) return 'skipped'
  if (run.engineVersion !== ENGINE_VERSION) {
    // Workers upgraded in the middle of the run: figures of two engine versions would not make one
    // consistent result (the draws' stored series change layout between versions, for one).
    const ended = await endRunUnsuccessfully(runId, 'failed', `This run was started on engine ${run.engineVersion} and the workers now run engine ${ENGINE_VERSION}; its figures would mix the two. Retry the run to compute it on engine ${ENGINE_VERSION}.`)
    if (ended) await notifyRunEnded(runId)
    return 'skipped'
  }
  if (chunk.state === 'done') return (await finaliseIfComplete(runId)) ? 'finalised' : 'duplicate'
  if (run.state === 'queued') {
    await db.update(runs).set({ state: 'running', startedAt: new Date() }).where(and(eq(runs.id, runId), eq(runs.state, 'queued')))
  }
  await db.update(runChunks).set({ attempts: chunk.attempts + 1, worker: workerName })
    .where(and(eq(runChunks.runId, runId), eq(runChunks.chunkIndex, chunkIndex)))

  const [version] = await db.select().from(assumptionSetVersions).where(eq(assumptionSetVersions.id, run.assumptionVersionId))
  const assumptions = parseAssumptions(version!.parameters)
  const snapshots = await db.select().from(runSiteSnapshots)
    .where(and(eq(runSiteSnapshots.runId, runId), inArray(runSiteSnapshots.siteId, chunk.siteIds)))
    .orderBy(asc(runSiteSnapshots.position))
  const computeStart = epochMs()
  const snapshotMs = computeStart - pickedUpAt

  const handled = await Promise.all(snapshots.map(async (snap) => {
    const site = snap.site
    const submittedAt = epochMs()
    try {
      const computation = await computeOnThread({
        site, assumptions, mode: run.mode, runSeed: run.seed,
        targetRse: run.targetRse, maxSamplesPerTank: run.maxSamplesPerTank, negligibleRatePerYear: run.negligibleRatePerYear, years: run.years,
        clustering: run.mode === 'year' && run.stormClustering && run.clusteringFrame
          ? siteClustering(run.clusteringFrame, assumptions.stormClustering, snap.facts.latitudeDeg, snap.facts.longitudeDeg)
          : null,
        assumptionDraws: run.assumptionDraws,
      })
      return { computation, submittedAt, resolvedAt: epochMs() }
    } catch (error) {
      throw new SiteComputationError(`site "${site.name}" (${site.id}): ${(error as Error).message}`)
    }
  }))
  const computations = handled.map(h => h.computation) satisfies SiteComputation[]
  const storeStart = epochMs()
  const transfer = threadTransfer(handled.map(h => ({ submittedAt: h.submittedAt, resolvedAt: h.resolvedAt, thread: h.computation.timing })))
  const sumOf = (k: 'prepareMs' | 'figuresMs' | 'eventBandsMs') => computations.reduce((n, c) => n + c.timing[k], 0)
  const timing: ChunkTiming = {
    worker: workerName, queuedAt, pickedUpAt, endedAt: 0, snapshotMs, computeWallMs: storeStart - computeStart,
    prepareMs: sumOf('prepareMs'), figuresMs: sumOf('figuresMs'), eventBandsMs: sumOf('eventBandsMs'), ...transfer,
    storeMs: 0, finaliseMs: 0, sites: computations.length, tanks: computations.reduce((n, c) => n + c.tanks.length, 0),
    siteThreads: handled.map(h => [h.computation.timing.threadId, h.submittedAt, h.computation.timing.startedAt, h.computation.timing.endedAt, h.resolvedAt]),
  }

  // The run may have been cancelled while this chunk computed: then nothing is stored.
  const stored = await db.transaction(async (tx) => {
    // The run row is locked for update first: chunks finishing together then queue here instead of
    // deadlocking on the later update of the run's counters.
    const [current] = await tx.select({ state: runs.state }).from(runs).where(eq(runs.id, runId)).for('no key update')
    if (current?.state !== 'running') return null
    return storeChunk(tx, runId, chunkIndex, computations, workerName, () => {
      const endedAt = epochMs()
      return { ...timing, storeMs: endedAt - storeStart, endedAt }
    })
  })
  if (!stored) return 'skipped'
  if (stored.chunksDone === stored.chunksTotal) {
    const finaliseStart = epochMs()
    const finalised = await finaliseIfComplete(runId)
    if (finalised) {
      const endedAt = epochMs()
      // The roll-up's time goes on the last chunk's timing (a figure for the benchmark; nothing reads it back).
      await db.update(runChunks).set({ timing: sql`${runChunks.timing} || ${JSON.stringify({ finaliseMs: endedAt - finaliseStart, endedAt })}::jsonb` })
        .where(and(eq(runChunks.runId, runId), eq(runChunks.chunkIndex, chunkIndex)))
      return 'finalised'
    }
  }
  return stored.alreadyDone ? 'duplicate' : 'stored'
}

async function finaliseIfComplete(runId: string): Promise<boolean> {
  const finalised = await finaliseRun(runId)
  if (finalised) {
    // The result views' documents, stored now so that no viewer waits for their build.
    await storeRunDocuments(useDb(), runId).catch((error: Error) => console.error(`[runs] result documents of ${runId}: ${error.message}`))
    await notifyRunEnded(runId)
  }
  return finalised
}
