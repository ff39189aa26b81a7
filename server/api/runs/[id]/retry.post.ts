// POST /api/runs/:id/retry — start a new run with the same portfolio, assumptions, mode, seed and
// targets (on the inventory as it is now).
import { getRun } from '~~/server/runs/queries'
import { startRun } from '~~/server/runs/start'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event, { roles: ROLES.editors })
  const id = readId(event, 'Run')
  const run = await getRun(member.organisationId, id)
  if (!run) notFound('Run')
  const again = await startRun({
    portfolioId: run.portfolioId, assumptionVersionId: run.assumptions.versionId, mode: run.mode, seed: run.seed,
    targetRse: run.targetRse, years: run.years, maxSamplesPerTank: run.maxSamplesPerTank, chunkSize: run.chunkSize,
    negligibleRatePerYear: run.negligibleRatePerYear, stormClustering: run.stormClustering, assumptionDraws: run.assumptionDraws,
  }, { userId: member.user.id, organisationId: member.organisationId, via: auditVia(event) }, { retryOf: id })
  setResponseStatus(event, 201)
  return again
})
