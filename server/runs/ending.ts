// How a run ends other than by success, and the e-mail sent when it ends either way.
import { and, eq, inArray } from 'drizzle-orm'
import { useDb } from '../db'
import { organisations, runPortfolioResults, runs, runSiteResults, runTankResults, users } from '../db/schema'
import { enqueue } from '../jobs/queue'
import { runEndedMessage } from '../mail/templates'
import { portfolioResult } from '../results/queries'

const OPEN_STATES = ['queued', 'running'] as const

/** Ends an open run as failed or cancelled and removes any partial results. Returns false if it had ended. */
export async function endRunUnsuccessfully(runId: string, state: 'failed' | 'cancelled', message: string | null): Promise<boolean> {
  return useDb().transaction(async (tx) => {
    const [ended] = await tx.update(runs).set({ state, errorMessage: message, finishedAt: new Date() })
      .where(and(eq(runs.id, runId), inArray(runs.state, [...OPEN_STATES])))
      .returning({ id: runs.id })
    if (!ended) return false
    // Nothing of a failed or cancelled run is ever shown as a result.
    await tx.delete(runTankResults).where(eq(runTankResults.runId, runId))
    await tx.delete(runSiteResults).where(eq(runSiteResults.runId, runId))
    await tx.delete(runPortfolioResults).where(eq(runPortfolioResults.runId, runId))
    return true
  })
}

/** Queues the "run ended" e-mail to the person who started the run. */
export async function notifyRunEnded(runId: string): Promise<void> {
  const db = useDb()
  const [row] = await db.select({ run: runs, email: users.email, name: users.name, currency: organisations.currency }).from(runs)
    .innerJoin(organisations, eq(organisations.id, runs.organisationId))
    .leftJoin(users, eq(users.id, runs.requestedBy)).where(eq(runs.id, runId))
  if (!row?.email) return
  const portfolio = await portfolioResult(runId)
  const message = runEndedMessage({ run: row.run, recipientName: row.name ?? '', portfolio, currency: row.currency })
  await enqueue('mail.send', { to: row.email, ...message, organisationId: row.run.organisationId })
}
