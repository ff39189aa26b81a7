// The background worker: `npm run worker` (npm start runs one beside the server).
// Any number may run, here or on other machines pointed at the same DATABASE_URL.
import { closeDb } from '../db/index'
import { closeThreadPool } from '../runs/thread-pool'
import { BEATING_QUEUES, startReaper, withHeartbeat } from './heartbeat'
import { stopBoss, useBoss } from './queue'
import { jobRegistry } from './registry'
import type { JobName } from './types'

let stopReaper: (() => void) | undefined

async function main() {
  const boss = await useBoss({ supervise: true })
  for (const name of Object.keys(jobRegistry) as JobName[]) {
    const entry = jobRegistry[name]
    const handler = entry.handler as Parameters<typeof boss.work>[2]
    // Long jobs beat while worked, so a dead worker's jobs are handed on in seconds (heartbeat.ts).
    const worked = (BEATING_QUEUES as readonly JobName[]).includes(name) ? withHeartbeat(name, handler) : handler
    for (let i = 0; i < entry.concurrency(); i++) {
      await boss.work(name, entry.work, worked)
    }
  }
  stopReaper = startReaper(boss)
  console.log(`[worker] ready (pid ${process.pid}); queues: ${Object.keys(jobRegistry).join(', ')}`)
}

let stopping = false
async function shutdown(signal: string) {
  if (stopping) return
  stopping = true
  console.log(`[worker] ${signal}: finishing current jobs, then stopping`)
  stopReaper?.()
  await stopBoss().catch(() => {})
  await closeThreadPool().catch(() => {})
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
