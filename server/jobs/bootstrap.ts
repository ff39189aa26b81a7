// The worker process's plumbing: start pg-boss with maintenance, work every queue of the registry
// it is given (beating queues with heartbeats), reap the jobs of dead workers, and stop cleanly on
// SIGINT / SIGTERM. Which handlers there are is the caller's (worker.ts); nothing here imports a domain.
import { closeDb } from '../db/index'
import { startReaper, withHeartbeat } from './heartbeat'
import { stopBoss, useBoss } from './queue'
import type { JobRegistry } from './registry'
import type { JobName } from './types'

export interface WorkerHooks {
  /** Runs on shutdown after the queue stopped and before the database closes (e.g. stop the threads). */
  onStop?: () => Promise<void>
}

export function runWorker(registry: JobRegistry, hooks: WorkerHooks = {}): void {
  let stopReaper: (() => void) | undefined
  let stopping = false

  async function main() {
    const boss = await useBoss({ supervise: true })
    for (const name of Object.keys(registry) as JobName[]) {
      const entry = registry[name]
      const handler = entry.handler as Parameters<typeof boss.work>[2]
      // Long jobs beat while worked, so a dead worker's jobs are handed on in seconds (heartbeat.ts).
      const worked = entry.beats ? withHeartbeat(name, handler) : handler
      for (let i = 0; i < entry.concurrency(); i++) {
        await boss.work(name, entry.work, worked)
      }
    }
    stopReaper = startReaper(boss, registry)
    console.log(`[worker] ready (pid ${process.pid}); queues: ${Object.keys(registry).join(', ')}`)
  }

  async function shutdown(signal: string) {
    if (stopping) return
    stopping = true
    console.log(`[worker] ${signal}: finishing current jobs, then stopping`)
    stopReaper?.()
    await stopBoss().catch(() => {})
    await hooks.onStop?.().catch(() => {})
    await closeDb().catch(() => {})
    process.exit(0)
  }
  // A connection dropped under a running query (PostgreSQL restarted) must not take the worker down:
  // the job fails, pg-boss retries it, and the pool reconnects.
  process.on('unhandledRejection', reason => console.error('[worker] unhandled rejection:', (reason as Error)?.message ?? reason))
  process.on('SIGINT', () => void shutdown('SIGINT'))
  process.on('SIGTERM', () => void shutdown('SIGTERM'))

  main().catch((error) => {
    console.error(`[worker] could not start: ${(error as Error).message}`)
    process.exit(1)
  })
}
