// GET /api/runs/:id/sites — every site of a succeeded run with its figures, coordinates and insured
// value (map, sites × metrics heatmap, site table).
import { findSucceededRun } from '~~/server/results/queries'
import { cachedDocument, sendDocument } from '~~/server/results/cache'
import { siteListView, type SiteListView } from '~~/server/results/views'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Results of this run')
  const run = await findSucceededRun(member.organisationId, id)
  if (!run) notFound('Results of this run')
  // Stored once per run and currency (server/results/documents.ts), kept in memory and sent as it is.
  const doc = await cachedDocument({ runId: run.id, engineVersion: run.engineVersion, view: 'sites', currency: member.currency }, () => siteListView(run, member.currency))
  if (!doc) notFound('Results of this run')
  return sendDocument<SiteListView>(event, doc)
})
