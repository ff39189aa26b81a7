// GET /api/runs/:id/sites/:siteId — one site of a succeeded run: figures, tanks (with property
// damage and interruption apart, and the neighbours a tank's fire would most likely reach), event
// bands, and the site as the run saw it (plan, what-if inputs).
import { exceedanceSeries, findSucceededRun, headline, lossSplit, runSpreadNeighbours, siteDetail } from '~~/server/results/queries'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Results of this run')
  const siteId = readId(event, 'Site in this run', 'siteId')
  const run = await findSucceededRun(member.organisationId, id)
  if (!run) notFound('Results of this run')
  const detail = await siteDetail(run.id, siteId)
  if (!detail) notFound('Site in this run')
  return {
    run: { id: run.id, mode: run.mode, seed: run.seed, portfolioName: run.portfolioName, assumptionVersionId: run.assumptionVersionId },
    currency: member.currency,
    facts: detail.facts,
    site: detail.site,
    headline: headline(detail.result, detail.result.yearSummary),
    exceedance: exceedanceSeries(detail.result.yearSummary, detail.facts.name),
    eventBands: detail.result.eventBands,
    radiusM: detail.result.radiusM,
    spread: await runSpreadNeighbours(run, detail.site),
    tanks: detail.tanks.map(t => ({
      tankId: t.tankId, tag: t.tag,
      lossSplit: lossSplit(t),
      // Year mode: the whole simulated counts behind the rates (Garwood intervals); null in frequency mode.
      direct: { rate: t.directRate, lo: t.directLo, hi: t.directHi, count: t.directCount },
      sparking: { rate: t.sparkingRate, lo: t.sparkingLo, hi: t.sparkingHi, count: t.sparkingCount, upperBoundOnly: t.upperBoundFigures.includes('sparking') },
      ignition: { rate: t.ignitionRate, lo: t.ignitionLo, hi: t.ignitionHi, count: t.ignitionCount, upperBoundOnly: t.upperBoundFigures.includes('ignition') },
      expectedAnnualLoss: { rate: t.expectedAnnualLoss, lo: t.expectedAnnualLossLo, hi: t.expectedAnnualLossHi, upperBoundOnly: t.upperBoundFigures.includes('expectedAnnualLoss') },
      samples: t.samples, drivingComponentClass: t.drivingComponentClass, converged: t.converged,
    })),
  }
})
