// Job 'storm.batch': one stored storm batch. The work commits in one transaction (windows, results,
// alerts and their mail jobs), so a retry after a dead worker starts from a clean state.
import type PgBoss from 'pg-boss'
import { processStormBatch } from '../storms/process'
import type { JobPayloads } from './types'

export async function handleStormBatch(jobs: PgBoss.Job<JobPayloads['storm.batch']>[]): Promise<void> {
  for (const job of jobs) await processStormBatch(job.data.batchId)
}
