// GET /api/runs/:id/sites/:siteId — one site of a succeeded run: figures, tanks, event bands, and the
// site as the run saw it (plan, what-if inputs).
import { z } from 'zod'
import { exceedanceSeries, findSucceededRun, headline, siteDetail } from '~~/server/results/queries'

const params = z.object({ id: z.uuid('Unknown run.'), siteId: z.uuid('Unknown site.') })

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const { id, siteId } = readValidParams(event, params)
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
    tanks: detail.tanks.map(t => ({
      tankId: t.tankId, tag: t.tag,
      direct: { rate: t.directRate, lo: t.directLo, hi: t.directHi },
      sparking: { rate: t.sparkingRate, lo: t.sparkingLo, hi: t.sparkingHi },
      ignition: { rate: t.ignitionRate, lo: t.ignitionLo, hi: t.ignitionHi },
      expectedAnnualLoss: { rate: t.expectedAnnualLoss, lo: t.expectedAnnualLossLo, hi: t.expectedAnnualLossHi },
      samples: t.samples, drivingComponentClass: t.drivingComponentClass, converged: t.converged,
    })),
  }
})
