// Applies drizzle-kit's generated migrations. Run before the server accepts requests (scripts/migrate.ts).
import { existsSync } from 'node:fs'
import { resolve } from 'node:path'
import { migrate } from 'drizzle-orm/node-postgres/migrator'
import type pg from 'pg'
import { useDb, usePool } from './index'

export function migrationsFolder(): string {
  // drizzle/ is not copied into .output, so it is always found from the project root.
  const folder = resolve(process.env.STORMLEDGER_ROOT ?? process.cwd(), 'drizzle')
  if (!existsSync(resolve(folder, 'meta/_journal.json'))) throw new Error(`No migrations found in ${folder}`)
  return folder
}

export async function applyMigrations(): Promise<void> {
  await migrate(useDb(), { migrationsFolder: migrationsFolder() })
}

/** The newest migration recorded in the database (tag and time), or null before the first. */
export async function latestAppliedMigration(pool: pg.Pool = usePool()): Promise<{ hash: string, createdAt: number } | null> {
  const exists = await pool.query(`SELECT to_regclass('drizzle.__drizzle_migrations') AS t`)
  if (!exists.rows[0]?.t) return null
  const { rows } = await pool.query('SELECT hash, created_at FROM drizzle.__drizzle_migrations ORDER BY created_at DESC LIMIT 1')
  return rows[0] ? { hash: String(rows[0].hash), createdAt: Number(rows[0].created_at) } : null
}
