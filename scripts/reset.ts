// npm run db:reset — drop every table of the database and migrate again.
// Refuses on a database that holds data unless --yes-delete-all-data is given.
import { closeDb, usePool } from '../server/db/index'
import { applyMigrations } from '../server/db/migrate'

const FLAG = '--yes-delete-all-data'

async function hasData(): Promise<boolean> {
  const { rows } = await usePool().query(`
    SELECT c.relname, c.reltuples FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
    WHERE n.nspname = 'public' AND c.relkind = 'r'`)
  for (const row of rows) {
    const count = await usePool().query(`SELECT EXISTS (SELECT 1 FROM public."${row.relname}") AS any`)
    if (count.rows[0]?.any) return true
  }
  return false
}

try {
  if (await hasData() && !process.argv.includes(FLAG)) {
    console.error(`[reset] the database ${new URL((await import('../server/db/config')).databaseUrl()).pathname.slice(1)} holds data; nothing was changed.`)
    console.error(`[reset] to delete all of it and start empty: npm run db:reset -- ${FLAG}`)
    process.exitCode = 1
  } else {
    await usePool().query('DROP SCHEMA IF EXISTS public CASCADE; DROP SCHEMA IF EXISTS drizzle CASCADE; DROP SCHEMA IF EXISTS pgboss CASCADE; CREATE SCHEMA public;')
    await applyMigrations()
    console.log('[reset] database emptied and migrated')
  }
} catch (error) {
  console.error(`[reset] failed: ${(error as Error).message}`)
  process.exitCode = 1
} finally {
  await closeDb()
}
