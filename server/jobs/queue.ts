// pg-boss on the application's PostgreSQL: one instance per process, queues created on start.
import PgBoss from 'pg-boss'
import { databaseUrl } from '../db/config'
import type { JobName, JobPayloads } from './types'

/** Queue options per job; every queue the product uses is listed here. */
export const queueOptions: Record<JobName, Omit<PgBoss.Queue, 'name'>> = {
  // Short first retries: a message refused during a database blip goes out seconds later.
  'mail.send': { retryLimit: 8, retryDelay: 2, retryBackoff: true, expireInSeconds: 60 },
  'auth.password-reset': { retryLimit: 5, retryDelay: 2, retryBackoff: true, expireInSeconds: 60 },
  // A chunk whose worker died is handed to another worker once it expires.
  'run.chunk': { retryLimit: 2, retryDelay: 1, expireInSeconds: Number(process.env.STORMLEDGER_CHUNK_EXPIRE_SECONDS ?? 600) },
  'scenario.site': { retryLimit: 2, retryDelay: 1, expireInSeconds: Number(process.env.STORMLEDGER_CHUNK_EXPIRE_SECONDS ?? 600) },
  // A batch's work commits in one transaction: a worker that dies mid-batch leaves nothing half-done.
  'storm.batch': { retryLimit: 4, retryDelay: 2, retryBackoff: true, expireInSeconds: 600 },
  // One transaction per attempt: a worker that dies mid-import leaves nothing written; the next attempt starts over.
  'inventory.import': { retryLimit: 2, retryDelay: 2, expireInSeconds: 900 },
}

let boss: PgBoss | undefined
let starting: Promise<PgBoss> | undefined

/** Starts (once) and returns this process's pg-boss. `supervise` runs maintenance; workers do it. */
export function useBoss(options: { supervise?: boolean } = {}): Promise<PgBoss> {
  starting ??= (async () => {
    const instance = new PgBoss({
      connectionString: databaseUrl(),
      schema: 'pgboss',
      max: 4,
      supervise: options.supervise ?? false,
      // Maintenance hands expired jobs (a worker that died) to other workers.
      maintenanceIntervalSeconds: Number(process.env.STORMLEDGER_QUEUE_MAINTENANCE_SECONDS ?? 30),
      schedule: false,
      application_name: 'stormledger',
    })
    instance.on('error', err => console.error('[queue]', err.message))
    await instance.start()
    for (const [name, opts] of Object.entries(queueOptions)) {
      if (!(await instance.getQueue(name))) await instance.createQueue(name, { name, ...opts })
    }
    boss = instance
    return instance
  })().catch((error) => {
    starting = undefined
    throw error
  })
  return starting
}

export async function enqueue<K extends JobName>(name: K, payload: JobPayloads[K], options: PgBoss.SendOptions = {}): Promise<string | null> {
  const b = await useBoss()
  return b.send(name, payload as object, options)
}

export async function stopBoss(): Promise<void> {
  const b = boss
  boss = undefined
  starting = undefined
  await b?.stop({ graceful: true, wait: true, timeout: 10_000 })
}
