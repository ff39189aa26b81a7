// Run names and each portfolio's reference run (the one the overview opens). At most one reference
// run per portfolio: the partial unique index runs_one_reference_per_portfolio holds it in the database.
import { and, eq } from 'drizzle-orm'
import type { H3Event } from 'h3'
import { useDb } from '../db'
import { runs } from '../db/schema'
import { recordAudit } from '../utils/audit'
import { AppError } from '../utils/errors'

interface By { organisationId: string, userId: string }

export async function renameRun(runId: string, name: string, by: By, event?: H3Event) {
  return useDb().transaction(async (tx) => {
    const [run] = await tx.select({ id: runs.id, name: runs.name }).from(runs).where(and(eq(runs.id, runId), eq(runs.organisationId, by.organisationId))).for('update')
    if (!run) throw new AppError(404, 'Run not found.')
    if (run.name === name) return
    await tx.update(runs).set({ name }).where(eq(runs.id, runId))
    await recordAudit({ organisationId: by.organisationId, userId: by.userId, action: 'update', entity: 'run', entityId: runId, before: { name: run.name }, after: { name } }, { tx, event })
  })
}

/** Makes a succeeded run its portfolio's reference run; the portfolio's previous reference run stops being one. */
export async function markReferenceRun(runId: string, by: By, event?: H3Event) {
  return useDb().transaction(async (tx) => {
    const [run] = await tx.select().from(runs).where(and(eq(runs.id, runId), eq(runs.organisationId, by.organisationId))).for('update')
    if (!run) throw new AppError(404, 'Run not found.')
    if (run.state !== 'succeeded') throw new AppError(409, 'Only a finished run can be the reference run.')
    if (run.isReference) return
    const [previous] = await tx.update(runs).set({ isReference: false })
      .where(and(eq(runs.organisationId, by.organisationId), eq(runs.portfolioId, run.portfolioId), eq(runs.isReference, true)))
      .returning({ id: runs.id, name: runs.name })
    await tx.update(runs).set({ isReference: true }).where(eq(runs.id, runId))
    await recordAudit({
      organisationId: by.organisationId, userId: by.userId, action: 'update', entity: 'run', entityId: runId,
      before: { referenceRun: previous ? `${previous.name} (${previous.id})` : null },
      after: { referenceRun: `${run.name || run.portfolioName} (${run.id})`, portfolio: run.portfolioName },
    }, { tx, event })
  })
}
