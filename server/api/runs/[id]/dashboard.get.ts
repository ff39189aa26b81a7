// GET /api/runs/:id/dashboard — headline figures with intervals, exceedance curves and what drives
// the total (top sites and tanks by expected fires) for a succeeded run.
import { findSucceededRun } from '~~/server/results/queries'
import { cachedDocument, sendDocument } from '~~/server/results/cache'
import { dashboardView, type DashboardView } from '~~/server/results/views'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Results of this run')
  const run = await findSucceededRun(member.organisationId, id)
  if (!run) notFound('Results of this run')
  // Stored once per run and currency (server/results/documents.ts), kept in memory and sent as it is.
  const doc = await cachedDocument({ runId: run.id, engineVersion: run.engineVersion, view: 'dashboard', currency: member.currency }, () => dashboardView(run, member.currency))
  if (!doc) notFound('Results of this run')
  return sendDocument<DashboardView>(event, doc)
})
