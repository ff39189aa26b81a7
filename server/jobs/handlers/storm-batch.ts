// Job 'storm.batch': one stored storm batch. The work commits in one transaction (windows, results,
// alerts and their mail jobs), so a retry after a dead worker starts from a clean state.
import type PgBoss from 'pg-boss'
import { failStormBatch, processStormBatch } from '../../storms/process'
import type { JobPayloads } from '../types'

export async function handleStormBatch(jobs: PgBoss.JobWithMetadata<JobPayloads['storm.batch']>[]): Promise<void> {
  for (const job of jobs) {
    try {
      await processStormBatch(job.data.batchId)
    } catch (error) {
      const message = (error as Error).message
      console.error(`[worker] storm batch ${job.data.batchId} attempt ${job.retryCount + 1}: ${message}`)
      if (job.retryCount >= job.retryLimit) await failStormBatch(job.data.batchId, `failed after ${job.retryCount + 1} attempts — ${message}`)
      throw error
    }
  }
}
