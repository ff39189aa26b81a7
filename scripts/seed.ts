// npm run db:seed — seed the demo scenario once (a second call does nothing).
import { closeDb } from '../server/db/index'
import { seedDemoOnce } from '../server/db/seed/index'
import '../server/db/seed/all'

try {
  const seeded = await seedDemoOnce()
  console.log(seeded ? '[seed] demo scenario seeded' : '[seed] demo scenario already present; nothing to do')
} catch (error) {
  console.error(`[seed] failed: ${(error as Error).message}`)
  process.exitCode = 1
} finally {
  await closeDb()
}
