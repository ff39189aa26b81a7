// npm run db:seed — seed the demo scenario once (a second call does nothing), then queue its first runs.
import { closeDb } from '../server/db/index'
import { seedDemoOnce } from '../server/db/seed/index'
import '../server/db/seed/all'
import { stopBoss } from '../server/jobs/queue'
import { queueDemoRuns } from '../server/runs/demo'

try {
  const seeded = await seedDemoOnce()
  if (seeded) {
    const runs = await queueDemoRuns()
    console.log(`[seed] demo scenario seeded; ${runs.length} demo run(s) queued for the worker`)
  } else {
    console.log('[seed] demo scenario already present; nothing to do')
  }
} catch (error) {
  console.error(`[seed] failed: ${(error as Error).message}`)
  process.exitCode = 1
} finally {
  await stopBoss().catch(() => {})
  await closeDb()
}
