// Inventory commits in the background: a file above BACKGROUND_IMPORT_ROWS rows is committed by the
// 'inventory.import' job instead of inside the request. The job re-reads the stored file against
// today's inventory and writes all of it in one transaction, or nothing — a worker that dies
// mid-import leaves nothing half-written and the job is worked again. Progress (rows checked, rows
// written) is stored as it goes, on its own connection, so the import page shows it live; the
// person who asked is mailed when the import ends.
import { and, eq, inArray } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { useDb, type Database } from '../db'
import { withClientTransaction } from '../db/transaction'
import { inventoryImports, users, type ImportProgress } from '../db/schema'
import { queueOptions, useBoss } from '../jobs/queue'
import { importEndedMail } from '../mail/templates'
import { recordAudit } from '../utils/audit'
import { AppError } from '../utils/errors'
import { appLink, queueMail } from '../utils/mail'
import { applyImport, planImport, type ImportSummary } from './import'
import { parseOnThread } from './parse-pool'
import { importFileBytes } from './files'

/** Files with more rows than this are committed by a background job (STORMLEDGER_IMPORT_BACKGROUND_ROWS, default 2,000). */
export function backgroundImportRows(): number {
  const n = Number(process.env.STORMLEDGER_IMPORT_BACKGROUND_ROWS ?? 2000)
  return Number.isFinite(n) && n >= 0 ? n : 2000
}

/** Rows the plan writes (new or changed) over the three sheets. */
export function rowsToWrite(summary: ImportSummary): number {
  return summary.sites.new + summary.sites.changed + summary.tanks.new + summary.tanks.changed + summary.structures.new + summary.structures.changed
}

/** Marks a previewed (or failed) import as committing and queues its job, in one transaction. */
export async function queueBackgroundCommit(event: H3Event, member: { organisationId: string, user: { id: string } }, importId: string, portfolioId: string | null) {
  const boss = await useBoss()
  return withClientTransaction(async ({ tx, bossDb }) => {
    const [record] = await tx.update(inventoryImports).set({
      status: 'committing', committedBy: member.user.id, commitPortfolioId: portfolioId, failureMessage: null, updatedAt: new Date(),
    }).where(and(eq(inventoryImports.id, importId), eq(inventoryImports.organisationId, member.organisationId), inArray(inventoryImports.status, ['previewed', 'failed'])))
      .returning({ id: inventoryImports.id, summary: inventoryImports.summary, fileName: inventoryImports.fileName })
    if (!record) throw new AppError(409, 'This import is being committed or was committed already.')
    const summary = record.summary as ImportSummary
    const progress: ImportProgress = { rowsTotal: summary.rows, rowsChecked: 0, rowsToWrite: rowsToWrite(summary), rowsWritten: 0 }
    await tx.update(inventoryImports).set({ progress }).where(eq(inventoryImports.id, record.id))
    await boss.insert([{ name: 'inventory.import', data: { importId: record.id }, singletonKey: record.id, ...queueOptions['inventory.import'] }], { db: bossDb })
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'import_queued', entity: 'inventory_import', entityId: record.id, after: { fileName: record.fileName, rows: summary.rows, portfolioId } }, { tx, event })
    return { id: record.id, status: 'committing' as const, summary, progress }
  })
}

async function mailCommitter(db: Database, importId: string, outcome: { ok: true, summary: ImportSummary } | { ok: false, message: string }): Promise<void> {
  const [row] = await db.select({ email: users.email, organisationId: inventoryImports.organisationId, fileName: inventoryImports.fileName })
    .from(inventoryImports).innerJoin(users, eq(users.id, inventoryImports.committedBy)).where(eq(inventoryImports.id, importId))
  if (!row) return
  await queueMail(row.email, importEndedMail({ fileName: row.fileName, outcome, link: appLink(`/inventory/import?import=${importId}`) }), { organisationId: row.organisationId })
}

/** Ends a background commit unsuccessfully (nothing was written): status, message, mail. */
export async function failBackgroundImport(importId: string, message: string): Promise<void> {
  const db = useDb()
  const ended = await db.update(inventoryImports).set({ status: 'failed', failureMessage: message.slice(0, 500), updatedAt: new Date() })
    .where(and(eq(inventoryImports.id, importId), eq(inventoryImports.status, 'committing'))).returning({ id: inventoryImports.id })
  if (ended.length > 0) await mailCommitter(db, importId, { ok: false, message })
}

/** The job's work: check the stored file again, write it in one transaction, store progress as it goes. */
export async function runBackgroundImport(importId: string): Promise<void> {
  const db = useDb()
  const [record] = await db.select().from(inventoryImports).where(eq(inventoryImports.id, importId))
  if (!record || record.status !== 'committing') return // ended already (a retry after the commit) or never queued
  const total = (record.summary as ImportSummary).rows
  const progress: ImportProgress = { rowsTotal: total, rowsChecked: 0, rowsToWrite: rowsToWrite(record.summary as ImportSummary), rowsWritten: 0 }
  const store = () => db.update(inventoryImports).set({ progress: { ...progress } }).where(and(eq(inventoryImports.id, importId), eq(inventoryImports.status, 'committing')))
  await store()

  const parsed = await parseOnThread({ data: await importFileBytes(record), fileName: record.fileName })
  if (!parsed.ok) return failBackgroundImport(importId, parsed.message)
  const plan = await planImport(db, record.organisationId, parsed.file)
  progress.rowsChecked = total
  progress.rowsToWrite = rowsToWrite(plan.summary)
  await store()
  if (plan.errors.length > 0) {
    await db.update(inventoryImports).set({ errors: plan.errors.slice(0, 1000), summary: plan.summary }).where(eq(inventoryImports.id, importId))
    return failBackgroundImport(importId, `Against today's inventory the file has ${plan.errors.length} error${plan.errors.length === 1 ? '' : 's'} (the inventory changed since the preview); nothing was imported. The errors are listed with the import; fix them and upload the file again.`)
  }

  const committed = await db.transaction(async (tx) => {
    // Progress goes out on the pool's other connections (committed at once), never through tx:
    // the import's row stays unlocked until the status below, so the updates never wait on it.
    await applyImport(tx as never, record.organisationId, plan, {
      portfolioId: record.commitPortfolioId,
      onProgress: async (written) => { progress.rowsWritten = written; await store() },
    })
    const done = await tx.update(inventoryImports).set({ status: 'committed', committedAt: new Date(), summary: plan.summary, progress: { ...progress, rowsWritten: progress.rowsToWrite } })
      .where(and(eq(inventoryImports.id, importId), eq(inventoryImports.status, 'committing'))).returning({ id: inventoryImports.id })
    if (done.length === 0) throw new AppError(409, 'the import ended elsewhere while it was written') // rolls the writes back
    await recordAudit({ organisationId: record.organisationId, userId: record.committedBy, action: 'import', entity: 'inventory_import', entityId: importId, after: { fileName: record.fileName, summary: plan.summary, portfolioId: record.commitPortfolioId, background: true } }, { tx: tx as never })
    return true
  })
  if (committed) await mailCommitter(db, importId, { ok: true, summary: plan.summary })
}
