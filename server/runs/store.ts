// Writing one chunk's computations: one transaction, idempotent (a chunk worked twice leaves one copy).
import { and, eq, sql } from 'drizzle-orm'
import type { Database } from '../db'
import { runChunks, runs, runSiteResults, runTankResults } from '../db/schema'
import type { Figure, SiteComputation } from './compute'
import { encodeEvents } from './events-codec'
import { figureValues, tankFigureValues } from '../results/figures'
import type { ChunkTiming } from './timing'

/** Names of the tank's figures that are upper bounds only (the negligible-rate rule stopped them). */
const upperBounds = (t: { sparking: Figure, ignition: Figure, expectedAnnualLoss: Figure }) =>
  (['sparking', 'ignition', 'expectedAnnualLoss'] as const).filter(k => t[k].upperBoundOnly)

const split = (x: { expectedAnnualLossPd: number, expectedAnnualLossBi: number }) => ({ expectedAnnualLossPd: x.expectedAnnualLossPd, expectedAnnualLossBi: x.expectedAnnualLossBi })

export interface StoredChunk { alreadyDone: boolean, chunksDone: number, chunksTotal: number }

/**
 * Stores a chunk unless it is stored already. The chunk row is locked first, so two workers that
 * finish the same chunk (after a retry or an expiry) write it once.
 */
export async function storeChunk(tx: Database, runId: string, chunkIndex: number, sites: SiteComputation[], worker: string, timing?: () => ChunkTiming): Promise<StoredChunk> {
  const [chunk] = await tx.select().from(runChunks)
    .where(and(eq(runChunks.runId, runId), eq(runChunks.chunkIndex, chunkIndex))).for('update')
  if (!chunk) throw new Error(`chunk ${chunkIndex} of run ${runId} does not exist`)
  if (chunk.state === 'done') {
    const [run] = await tx.select({ chunksDone: runs.chunksDone, chunksTotal: runs.chunksTotal }).from(runs).where(eq(runs.id, runId))
    return { alreadyDone: true, chunksDone: run?.chunksDone ?? 0, chunksTotal: run?.chunksTotal ?? 0 }
  }
  for (const s of sites) {
    await tx.insert(runSiteResults).values({
      runId, siteId: s.siteId, radiusM: s.radiusM, lambdaPerYear: s.lambdaPerYear,
      ...figureValues(s), ...split(s),
      samples: s.samples,
      yearSummary: s.yearSummary,
      events: s.events ? encodeEvents(s.events) : null,
      eventBands: s.eventBands,
      draws: s.draws?.site ?? null,
    })
    if (s.tanks.length > 0) {
      await tx.insert(runTankResults).values(s.tanks.map((t, i) => ({
        runId, siteId: s.siteId, tankId: t.tankId, tag: t.tag,
        ...tankFigureValues(t), ...split(t),
        upperBoundFigures: upperBounds(t),
        samples: t.samples, drivingComponentClass: t.drivingComponentClass, converged: t.converged,
        draws: s.draws?.tanks[i] ?? null,
      })))
    }
  }
  await tx.update(runChunks).set({ state: 'done', completedAt: new Date(), worker, timing: timing?.() ?? null })
    .where(and(eq(runChunks.runId, runId), eq(runChunks.chunkIndex, chunkIndex)))
  const [run] = await tx.update(runs)
    .set({ chunksDone: sql`${runs.chunksDone} + 1`, sitesDone: sql`${runs.sitesDone} + ${sites.length}` })
    .where(eq(runs.id, runId))
    .returning({ chunksDone: runs.chunksDone, chunksTotal: runs.chunksTotal })
  return { alreadyDone: false, chunksDone: run!.chunksDone, chunksTotal: run!.chunksTotal }
}
