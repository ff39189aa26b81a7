// The explicit registry: which handler works which queue, with what polling.
import type PgBoss from 'pg-boss'
import { handleMailSend } from './mail-send'
import { handlePasswordReset } from './password-reset'
import { handleRunChunk } from './run-chunk'
import { handleScenarioSite } from './scenario-site'
import { handleStormBatch } from './storm-batch'
import { threadCount } from '../runs/thread-pool'
import type { JobName, JobPayloads } from './types'

type Handler<T> = ((jobs: PgBoss.Job<T>[]) => Promise<unknown>) | ((jobs: PgBoss.JobWithMetadata<T>[]) => Promise<unknown>)
/** `concurrency`: how many of this queue's jobs one worker process works at once. */
type Registry = { [K in JobName]: { handler: Handler<JobPayloads[K]>, work: PgBoss.WorkOptions, concurrency: () => number } }

export const jobRegistry: Registry = {
  'mail.send': { handler: handleMailSend, work: { pollingIntervalSeconds: 1, batchSize: 5 }, concurrency: () => 1 },
  'auth.password-reset': { handler: handlePasswordReset, work: { pollingIntervalSeconds: 1, batchSize: 5 }, concurrency: () => 1 },
  // One chunk per core at a time; the chunk's sites spread over the thread pool.
  'run.chunk': { handler: handleRunChunk, work: { pollingIntervalSeconds: 0.5, batchSize: 1, includeMetadata: true }, concurrency: threadCount },
  // One site per core at a time (capital planning's scenario evaluations).
  'scenario.site': { handler: handleScenarioSite, work: { pollingIntervalSeconds: 0.5, batchSize: 1, includeMetadata: true }, concurrency: threadCount },
  'storm.batch': { handler: handleStormBatch, work: { pollingIntervalSeconds: 0.5, batchSize: 1, includeMetadata: true }, concurrency: () => 1 },
}
