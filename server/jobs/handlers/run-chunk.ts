// Job 'run.chunk': one chunk of sites of a run. Retried by pg-boss (bounded); after the last
// attempt the run fails with a message naming the site and the cause.
import type PgBoss from 'pg-boss'
import { endRunUnsuccessfully, notifyRunEnded } from '../../runs/ending'
import { workChunk } from '../../runs/work-chunk'
import type { JobPayloads } from '../types'

export async function handleRunChunk(jobs: PgBoss.JobWithMetadata<JobPayloads['run.chunk']>[]): Promise<void> {
  for (const job of jobs) {
    try {
      await workChunk(job.data.runId, job.data.chunkIndex, job.createdOn ? new Date(job.createdOn).getTime() : null)
    } catch (error) {
      const message = (error as Error).message
      console.error(`[worker] run ${job.data.runId} chunk ${job.data.chunkIndex} attempt ${job.retryCount + 1}: ${message}`)
      if (job.retryCount >= job.retryLimit) {
        const ended = await endRunUnsuccessfully(job.data.runId, 'failed', `Chunk ${job.data.chunkIndex + 1} failed after ${job.retryCount + 1} attempts — ${message}`)
        if (ended) await notifyRunEnded(job.data.runId)
        return
      }
      throw error
    }
  }
}
