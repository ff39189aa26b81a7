// A transaction on one pooled client, shared by Drizzle and pg-boss, so that rows and the jobs that
// work them commit together (or not at all).
import { drizzle } from 'drizzle-orm/node-postgres'
import type PgBoss from 'pg-boss'
import { usePool, type Database } from './index'
import * as schema from './schema'

export interface ClientTransaction {
  tx: Database
  /** Pass as `{ db }` to pg-boss's send/insert so jobs are queued in this transaction. */
  bossDb: PgBoss.Db
}

export async function withClientTransaction<T>(work: (t: ClientTransaction) => Promise<T>): Promise<T> {
  const client = await usePool().connect()
  try {
    await client.query('BEGIN')
    const tx = drizzle(client, { schema, casing: 'snake_case' }) as unknown as Database
    const bossDb: PgBoss.Db = { executeSql: (text, values) => client.query(text, values) }
    const result = await work({ tx, bossDb })
    await client.query('COMMIT')
    return result
  } catch (error) {
    await client.query('ROLLBACK').catch(() => {})
    throw error
  } finally {
    client.release()
  }
}
