// The import service behind the import routes: read → validate → compare (preview, stored with the
// original file) and commit (all or nothing, in one transaction).
import { and, eq } from 'drizzle-orm'
import { createError, type H3Event } from 'h3'
import { useDb } from '../db'
import { inventoryImports, portfolios } from '../db/schema'
import { applyImport, planImport, type ImportPlan, type ImportSummary } from './import'
import { backgroundImportRows, queueBackgroundCommit, rowsToWrite } from './background-import'
import { parseOnThread } from './parse-pool'
import { forgetImportFile, importFileBytes, storeImportFile } from './files'
import type { Member } from '../utils/auth'
import { conflict, fail, notFound } from '../utils/errors'
import { recordAudit } from '../utils/audit'

const MAX_STORED_ERRORS = 1000

/** Reads the file on an upload thread (never on this event loop), then compares it with the inventory. */
async function planFor(organisationId: string, data: Buffer, fileName: string): Promise<ImportPlan> {
  const outcome = await parseOnThread({ data, fileName })
  if (!outcome.ok) fail(outcome.status, outcome.message)
  return await planImport(useDb(), organisationId, outcome.file)
}

/** Reads an upload and stores the preview (counts, row errors, original bytes). */
export async function previewUpload(event: H3Event, member: Member, upload: { fileName: string, contentType: string, data: Buffer }) {
  const plan = await planFor(member.organisationId, upload.data, upload.fileName)
  // The file goes to object storage first: a failed put leaves no row; a failed insert removes the object.
  const stored = await storeImportFile(member.organisationId, upload.data, upload.contentType)
  const [record] = await useDb().insert(inventoryImports).values({
    organisationId: member.organisationId,
    uploadedBy: member.user.id,
    fileName: upload.fileName,
    contentType: upload.contentType,
    sizeBytes: stored.sizeBytes,
    fileKey: stored.key,
    fileSha256: stored.sha256,
    status: 'previewed',
    summary: plan.summary,
    errors: plan.errors.slice(0, MAX_STORED_ERRORS),
  }).returning({ id: inventoryImports.id, createdAt: inventoryImports.createdAt }).catch(async (error: unknown) => {
    await forgetImportFile(stored.key)
    throw error
  })
  return { id: record!.id, fileName: upload.fileName, status: 'previewed' as const, summary: plan.summary, errors: plan.errors.slice(0, MAX_STORED_ERRORS), createdAt: record!.createdAt }
}

/** Commits a previewed import: re-reads the stored file against today's inventory and writes all of it, or nothing. */
export async function commitImport(event: H3Event, member: Member, importId: string, portfolioId: string | null) {
  const db = useDb()
  if (portfolioId) {
    const [own] = await db.select({ id: portfolios.id }).from(portfolios).where(and(eq(portfolios.id, portfolioId), eq(portfolios.organisationId, member.organisationId)))
    if (!own) notFound('Portfolio')
  }
  const [current] = await db.select({ status: inventoryImports.status, summary: inventoryImports.summary }).from(inventoryImports)
    .where(and(eq(inventoryImports.id, importId), eq(inventoryImports.organisationId, member.organisationId)))
  if (!current) notFound('Import')
  if (current.status === 'committed') conflict('This import was committed already.')
  if (current.status === 'committing') conflict('This import is being committed in the background; its page shows the progress.')
  // A large file is committed by a background job (progress on the import page, mail when done).
  if ((current.summary as ImportSummary).rows > backgroundImportRows()) return queueBackgroundCommit(event, member, importId, portfolioId)
  return db.transaction(async (tx) => {
    const [record] = await tx.select().from(inventoryImports)
      .where(and(eq(inventoryImports.id, importId), eq(inventoryImports.organisationId, member.organisationId))).for('update')
    if (!record) notFound('Import')
    if (record.status === 'committed') conflict('This import was committed already.')
    if (record.status === 'committing') conflict('This import is being committed in the background; its page shows the progress.')
    const plan = await planFor(member.organisationId, await importFileBytes(record), record.fileName)
    if (plan.errors.length > 0) {
      // Row errors (sheet, row, column → message) are the import's own payload, shown as the preview shows them.
      throw createError({ statusCode: 400, statusMessage: `The file has ${plan.errors.length} error${plan.errors.length === 1 ? '' : 's'}; nothing was imported. Fix them and upload the file again.`, data: { errors: plan.errors.slice(0, MAX_STORED_ERRORS) } })
    }
    await applyImport(tx as never, member.organisationId, plan, { portfolioId })
    const total = plan.summary.rows
    await tx.update(inventoryImports).set({
      status: 'committed', committedAt: new Date(), committedBy: member.user.id, commitPortfolioId: portfolioId, summary: plan.summary,
      progress: { rowsTotal: total, rowsChecked: total, rowsToWrite: rowsToWrite(plan.summary), rowsWritten: rowsToWrite(plan.summary) },
    }).where(eq(inventoryImports.id, record.id))
    await recordAudit({ organisationId: member.organisationId, userId: member.user.id, action: 'import', entity: 'inventory_import', entityId: record.id, after: { fileName: record.fileName, summary: plan.summary, portfolioId } }, { tx, event })
    return { id: record.id, status: 'committed' as const, summary: plan.summary }
  })
}
