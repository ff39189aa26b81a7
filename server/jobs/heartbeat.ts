// Heartbeats of the jobs being worked, and the reclaiming of jobs whose worker died. A job queue
// only learns that a worker is gone when the job expires (600 s for a run chunk, which must be long
// enough for the slowest chunk); a heartbeat every few seconds shows it within seconds. Every
// worker reaps: in one transaction it locks the active jobs whose beat is stale (SKIP LOCKED, so two
// reapers never fail one job twice) and fails them through pg-boss, which retries them on any
// worker. Results stay bit-identical: a chunk is stored once, however often it is worked.
import { hostname } from 'node:os'
import type PgBoss from 'pg-boss'
import { usePool } from '../db'
import { failEvaluation } from '../capital/evaluations'
import { failStormBatch } from '../storms/process'
import { endRunUnsuccessfully, notifyRunEnded } from '../runs/ending'
import { settings } from '../settings'
import type { JobName, JobPayloads } from './types'

/** Queues whose jobs beat while worked (long computations); mail is short and expires on its own. */
export const BEATING_QUEUES = ['run.chunk', 'scenario.site', 'storm.batch'] as const satisfies JobName[]

const workerName = `${hostname()}:${process.pid}`

async function beat(queue: string, ids: string[]): Promise<void> {
  await usePool().query(
    `INSERT INTO job_heartbeats (job_id, queue, worker, beat_at) SELECT unnest($1::uuid[]), $2, $3, now()
     ON CONFLICT (job_id) DO UPDATE SET beat_at = now(), worker = excluded.worker`, [ids, queue, workerName])
}

/** Wraps a handler so its jobs beat from start to end (and once more at the end). */
export function withHeartbeat<J extends { id: string }>(queue: string, handler: (jobs: J[]) => Promise<unknown>): (jobs: J[]) => Promise<unknown> {
  return async (jobs) => {
    const ids = jobs.map(j => j.id)
    await beat(queue, ids).catch(error => console.error('[heartbeat]', (error as Error).message))
    const timer = setInterval(() => void beat(queue, ids).catch(error => console.error('[heartbeat]', (error as Error).message)), settings.heartbeatSeconds * 1000)
    try {
      return await handler(jobs)
    } finally {
      clearInterval(timer)
      // The last beat: if marking the job done fails (database restarted), it is reclaimed after the stale time.
      await beat(queue, ids).catch(() => {})
    }
  }
}

interface StaleJob { id: string, name: string, retry_count: number, retry_limit: number, data: unknown, worker: string | null }

/** Fails (for retry) every active beating job whose last beat is older than the stale time. Returns how many. */
export async function reclaimStaleJobs(boss: PgBoss): Promise<number> {
  const client = await usePool().connect()
  let stale: StaleJob[] = []
  try {
    await client.query('BEGIN')
    // A job with no beat yet counts from when it started (its worker died before the first beat).
    const { rows } = await client.query<StaleJob>(
      `SELECT j.id, j.name, j.retry_count, j.retry_limit, j.data, h.worker FROM pgboss.job j
       LEFT JOIN job_heartbeats h ON h.job_id = j.id
       WHERE j.name = ANY($1::text[]) AND j.state = 'active'
         AND coalesce(h.beat_at, j.started_on) < now() - make_interval(secs => $2)
       FOR UPDATE OF j SKIP LOCKED`, [BEATING_QUEUES, settings.staleAfterSeconds])
    stale = rows
    const db = { executeSql: (text: string, values: unknown[]) => client.query(text, values) }
    for (const job of stale) {
      await boss.fail(job.name, job.id, { message: `its worker (${job.worker ?? 'unknown'}) stopped answering for ${settings.staleAfterSeconds} s` }, { db })
    }
    await client.query(`DELETE FROM job_heartbeats WHERE beat_at < now() - interval '1 day'`)
    await client.query('COMMIT')
  } catch (error) {
    await client.query('ROLLBACK').catch(() => {})
    throw error
  } finally {
    client.release()
  }
  for (const job of stale) {
    console.log(`[worker] reclaimed ${job.name} job ${job.id} from ${job.worker ?? 'a worker that never beat'}`)
    if (job.retry_count < job.retry_limit) continue
    // No attempt is left: nobody else will end the work, so end it here, as the handler would have.
    const attempts = job.retry_count + 1
    if (job.name === 'run.chunk') {
      const data = job.data as JobPayloads['run.chunk']
      if (await endRunUnsuccessfully(data.runId, 'failed', `Chunk ${data.chunkIndex + 1} failed after ${attempts} attempts — its worker stopped answering.`)) await notifyRunEnded(data.runId)
    } else if (job.name === 'scenario.site') {
      const data = job.data as JobPayloads['scenario.site']
      await failEvaluation(data.evaluationId, `Site ${data.siteId} failed after ${attempts} attempts — its worker stopped answering.`)
    } else if (job.name === 'storm.batch') {
      await failStormBatch((job.data as JobPayloads['storm.batch']).batchId, `failed after ${attempts} attempts — its worker stopped answering.`)
    }
  }
  return stale.length
}

/** Reaps every few seconds until stopped. */
export function startReaper(boss: PgBoss): () => void {
  let running = false
  const timer = setInterval(() => {
    if (running) return
    running = true
    reclaimStaleJobs(boss).catch(error => console.error('[heartbeat] reclaim:', (error as Error).message)).finally(() => { running = false })
  }, Math.max(1000, settings.heartbeatSeconds * 1000))
  return () => clearInterval(timer)
}
