// The shape of the job registry: which handler works which queue, with what polling, how many at
// once, whether its jobs beat while worked, and what ends the work when a job's worker died on its
// last attempt. Plumbing only: the entries live beside their handlers (handlers/index.ts), and the
// worker entry (worker.ts) hands them to the bootstrap, so nothing here imports a domain.
import type PgBoss from 'pg-boss'
import type { JobName, JobPayloads } from './types'

type Handler<T> = ((jobs: PgBoss.Job<T>[]) => Promise<unknown>) | ((jobs: PgBoss.JobWithMetadata<T>[]) => Promise<unknown>)

export interface JobEntry<T> {
  handler: Handler<T>
  work: PgBoss.WorkOptions
  /** How many of this queue's jobs one worker process works at once. */
  concurrency: () => number
  /** Long jobs beat while worked (heartbeat.ts), so a dead worker's jobs are handed on in seconds. */
  beats?: boolean
  /** A beating job whose worker died on its last attempt: end the work it belonged to, as the handler would have. */
  onAbandoned?: (data: T, message: string) => Promise<void>
}

export type JobRegistry = { [K in JobName]: JobEntry<JobPayloads[K]> }

/** Names of the queues whose jobs beat while worked. */
export function beatingQueues(registry: JobRegistry): JobName[] {
  return (Object.keys(registry) as JobName[]).filter(name => registry[name].beats === true)
}
