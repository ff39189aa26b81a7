// The single database accessor: one pg pool per process, wrapped by Drizzle.
import { drizzle, type NodePgQueryResultHKT } from 'drizzle-orm/node-postgres'
import type { PgDatabase } from 'drizzle-orm/pg-core'
import pg from 'pg'
import { databaseUrl } from './config'
import * as schema from './schema'

export { schema }
/** The database or a transaction on it: helpers take either, so they can join the caller's transaction. */
export type Database = PgDatabase<NodePgQueryResultHKT, typeof schema>

function createDatabase(pool: pg.Pool) {
  return drizzle(pool, { schema, casing: 'snake_case' })
}

let pool: pg.Pool | undefined
let database: ReturnType<typeof createDatabase> | undefined

export function usePool(): pg.Pool {
  if (!pool) {
    pool = new pg.Pool({ connectionString: databaseUrl(), max: Number(process.env.STORMLEDGER_DB_POOL ?? 10) })
    // A dropped connection (e.g. PostgreSQL restarted) must not kill the process; the pool reconnects.
    pool.on('error', err => console.error('[db] idle client error:', err.message))
  }
  return pool
}

export function useDb(): ReturnType<typeof createDatabase> {
  database ??= createDatabase(usePool())
  return database
}

export async function closeDb(): Promise<void> {
  const p = pool
  pool = undefined
  database = undefined
  await p?.end()
}
