// What /api/health reports: the database, the migration level and the queue, each checked live.
import type pg from 'pg'
import { latestAppliedMigration } from './migrate'

export interface HealthReport {
  status: 'ok' | 'degraded'
  version: string
  database: { reachable: boolean, error?: string }
  migrations: { latest: string | null, appliedAt: string | null, pending: number | null }
  queue: { reachable: boolean, schemaVersion: number | null }
}

export async function checkHealth(pool: pg.Pool, version: string, journalTags: string[]): Promise<HealthReport> {
  const report: HealthReport = {
    status: 'ok',
    version,
    database: { reachable: false },
    migrations: { latest: null, appliedAt: null, pending: null },
    queue: { reachable: false, schemaVersion: null },
  }
  try {
    await pool.query('SELECT 1')
    report.database.reachable = true
    const latest = await latestAppliedMigration(pool)
    const applied = await pool.query(`SELECT count(*)::int AS n FROM drizzle.__drizzle_migrations`).catch(() => ({ rows: [{ n: 0 }] }))
    const appliedCount = Number(applied.rows[0]?.n ?? 0)
    report.migrations = {
      latest: appliedCount > 0 ? journalTags[appliedCount - 1] ?? null : null,
      appliedAt: latest ? new Date(latest.createdAt).toISOString() : null,
      pending: Math.max(0, journalTags.length - appliedCount),
    }
    const boss = await pool.query(`SELECT to_regclass('pgboss.version') AS t`)
    if (boss.rows[0]?.t) {
      const v = await pool.query('SELECT version FROM pgboss.version LIMIT 1')
      report.queue = { reachable: true, schemaVersion: Number(v.rows[0]?.version ?? 0) }
    }
  } catch (error) {
    report.database.error = (error as Error).message
  }
  if (!report.database.reachable || !report.queue.reachable || report.migrations.pending !== 0) report.status = 'degraded'
  return report
}
