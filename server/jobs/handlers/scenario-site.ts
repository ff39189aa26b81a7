// Job 'scenario.site': one site of a capital scenario evaluation (baseline and its scenarios on
// common random numbers). Retried by pg-boss; after the last attempt the evaluation fails.
import type PgBoss from 'pg-boss'
import { failEvaluation, workScenarioSite } from '../../capital/evaluations'
import type { JobPayloads } from '../types'

export async function handleScenarioSite(jobs: PgBoss.JobWithMetadata<JobPayloads['scenario.site']>[]): Promise<void> {
  for (const job of jobs) {
    try {
      await workScenarioSite(job.data.evaluationId, job.data.siteId)
    } catch (error) {
      const message = (error as Error).message
      console.error(`[worker] evaluation ${job.data.evaluationId} site ${job.data.siteId} attempt ${job.retryCount + 1}: ${message}`)
      if (job.retryCount >= job.retryLimit) {
        await failEvaluation(job.data.evaluationId, `Site ${job.data.siteId} failed after ${job.retryCount + 1} attempts — ${message}`)
        return
      }
      throw error
    }
  }
}
