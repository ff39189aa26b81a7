// GET /api/runs/:id/accumulation — which sites lose together in a succeeded simulated-years run's
// worst years: the worst years (beyond the loss at ?returnPeriodYears, default 100), each site's share
// of their ground-up loss and how often it loses in them, and the groups of sites that co-lose.
import { accumulationQuerySchema } from '~~/shared/schemas/accumulation'
import { findSucceededRun } from '~~/server/results/queries'
import { cachedJson } from '~~/server/results/cache'
import { runAccumulation } from '~~/server/results/accumulation'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Results of this run')
  const query = readValidQuery(event, accumulationQuerySchema)
  const run = await findSucceededRun(member.organisationId, id)
  if (!run) notFound('Results of this run')
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  return cachedJson(`accumulation:${run.id}:${member.currency}:${query.returnPeriodYears}:${query.minShareTogether}`, () => runAccumulation(run, member.currency, query))
})
