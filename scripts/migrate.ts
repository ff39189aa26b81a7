// npm run db:migrate — apply pending migrations to DATABASE_URL (or the local cluster).
import { applyMigrations, latestAppliedMigration } from '../server/db/migrate'
import { closeDb } from '../server/db/index'

try {
  await applyMigrations()
  const latest = await latestAppliedMigration()
  console.log(`[migrate] database is at migration ${latest?.hash.slice(0, 12) ?? '(none)'}`)
} catch (error) {
  console.error(`[migrate] failed: ${(error as Error).message}`)
  process.exitCode = 1
} finally {
  await closeDb()
}
