// Stored result documents: the serialised answer of a result view (server/results/views.ts) of a
// succeeded run, kept in run_result_documents so that no web process rebuilds it after the first
// build — not another process, not a restart. Results of a succeeded run never change; a document is
// valid while its version (the run's engine version and the view's format) is the current one, and
// is rebuilt on the next read otherwise. The first read of a document builds it under a PostgreSQL
// advisory lock on (run, view, currency): simultaneous first readers in any number of processes wait
// for the one build and then read what it stored.
import { and, eq, sql } from 'drizzle-orm'
import type { Database } from '../db'
import { organisations, runResultDocuments, runs } from '../db/schema'
import { dashboardView, siteListView, VIEW_FORMATS, type ResultView } from './views'

export interface DocumentKey { runId: string, engineVersion: string, view: ResultView, currency: string }

/** The version a document of this run and view must carry to be served. */
export function documentVersion(key: Pick<DocumentKey, 'engineVersion' | 'view'>): string {
  return `${key.engineVersion}/${key.view}.${VIEW_FORMATS[key.view]}`
}

async function readCurrent(db: Database, key: DocumentKey, version: string): Promise<string | null> {
  const [row] = await db.select({ version: runResultDocuments.version, body: runResultDocuments.body }).from(runResultDocuments)
    .where(and(eq(runResultDocuments.runId, key.runId), eq(runResultDocuments.view, key.view), eq(runResultDocuments.currency, key.currency)))
  return row && row.version === version ? row.body : null
}

/**
 * The stored JSON of a view, built (by `build`, serialised once) and stored when missing or stale.
 * `build` returning null (no results to show) stores nothing and gives null.
 */
export async function storedDocument(db: Database, key: DocumentKey, build: () => Promise<unknown>): Promise<string | null> {
  const version = documentVersion(key)
  const hit = await readCurrent(db, key, version)
  if (hit !== null) return hit
  return db.transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`run-document:${key.runId}:${key.view}:${key.currency}`}))`)
    // Another reader may have built it while this one waited for the lock.
    const built = await readCurrent(tx, key, version)
    if (built !== null) return built
    const payload = await build()
    if (payload === null) return null
    const body = JSON.stringify(payload)
    await tx.insert(runResultDocuments).values({ runId: key.runId, view: key.view, currency: key.currency, version, body })
      .onConflictDoUpdate({ target: [runResultDocuments.runId, runResultDocuments.view, runResultDocuments.currency], set: { version, body, builtAt: new Date() } })
    return body
  })
}

/**
 * At a run's end (server/runs/work-chunk.ts): stores the dashboard and site-list documents in the
 * organisation's currency, so that the first viewer reads them instead of building them. A failure
 * here leaves the run as it is: the documents are then built on their first read.
 */
export async function storeRunDocuments(db: Database, runId: string): Promise<void> {
  const [row] = await db.select({ run: runs, currency: organisations.currency }).from(runs)
    .innerJoin(organisations, eq(organisations.id, runs.organisationId))
    .where(and(eq(runs.id, runId), eq(runs.state, 'succeeded')))
  if (!row) return
  const { run, currency } = row
  await storedDocument(db, { runId, engineVersion: run.engineVersion, view: 'dashboard', currency }, () => dashboardView(run, currency))
  await storedDocument(db, { runId, engineVersion: run.engineVersion, view: 'sites', currency }, () => siteListView(run, currency))
}
