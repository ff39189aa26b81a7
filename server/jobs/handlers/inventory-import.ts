// Job 'inventory.import': a large inventory import's commit. Each attempt writes in one transaction,
// so a retry after a dead worker starts from a clean state; the last failed attempt ends the import.
import type PgBoss from 'pg-boss'
import { failBackgroundImport, runBackgroundImport } from '../../inventory/background-import'
import type { JobPayloads } from '../types'

export async function handleInventoryImport(jobs: PgBoss.JobWithMetadata<JobPayloads['inventory.import']>[]): Promise<void> {
  for (const job of jobs) {
    try {
      await runBackgroundImport(job.data.importId)
    } catch (error) {
      const message = (error as Error).message
      console.error(`[worker] inventory import ${job.data.importId} attempt ${job.retryCount + 1}: ${message}`)
      if (job.retryCount >= job.retryLimit) await failBackgroundImport(job.data.importId, `The import failed after ${job.retryCount + 1} attempts (${message}); nothing was imported.`)
      throw error
    }
  }
}
