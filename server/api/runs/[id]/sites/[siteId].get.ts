// GET /api/runs/:id/sites/:siteId — one site of a succeeded run: figures, tanks (with property
// damage and interruption apart, and the neighbours a tank's fire would most likely reach), event
// bands, and the site as the run saw it (plan, what-if inputs).
import { exceedanceSeries, findSucceededRun, headline, runSpreadNeighbours, siteDetail } from '~~/server/results/queries'

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Results of this run')
  const siteId = readId(event, 'Site in this run', 'siteId')
  const run = await findSucceededRun(member.organisationId, id)
  if (!run) notFound('Results of this run')
  const detail = await siteDetail(run.id, siteId)
  if (!detail) notFound('Site in this run')
  return {
    run: { id: run.id, mode: run.mode, seed: run.seed, portfolioName: run.portfolioName, assumptionVersionId: run.assumptionVersionId, assumptionDraws: run.assumptionDraws },
    currency: member.currency,
    facts: detail.facts,
    site: detail.site,
    headline: headline(detail.result.figures, detail.result.lossSplit, detail.result.yearSummary),
    exceedance: exceedanceSeries(detail.result.yearSummary, detail.facts.name),
    eventBands: detail.result.eventBands,
    radiusM: detail.result.radiusM,
    /** Assumption uncertainty: the site's 5/50/95 % points across draws and its sensitivity indices; null: no assumption draws. */
    assumptionBands: detail.result.draws,
    spread: await runSpreadNeighbours(run, detail.site),
    // Each figure is the shared result figure (shared/results/figure.ts): simulated-years runs carry
    // the whole counts behind the rates (Garwood intervals; null in frequency mode), and a figure the
    // negligible-rate rule stopped says upperBoundOnly.
    tanks: detail.tanks.map(t => ({
      tankId: t.tankId, tag: t.tag,
      lossSplit: t.lossSplit,
      ...t.figures,
      samples: t.samples, drivingComponentClass: t.drivingComponentClass, converged: t.converged,
      assumptionBands: t.draws?.bands ?? null,
    })),
  }
})
