// GET /api/runs/:id/sites — every site of a succeeded run with its figures, coordinates and insured
// value (map, sites × metrics heatmap, site table).
import { findSucceededRun, siteResults } from '~~/server/results/queries'
import { cachedJson } from '~~/server/results/cache'
import type { ResultFigure } from '~~/shared/results/figure'

const interval = (f: ResultFigure): [number, number] => [f.lo, f.hi]

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Results of this run')
  const run = await findSucceededRun(member.organisationId, id)
  if (!run) notFound('Results of this run')
  // Serialised once per run and currency (server/results/cache.ts), sent as it is.
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  return cachedJson(`sites:${run.id}:${member.currency}`, async () => {
    const sites = await siteResults(run.id)
    return {
      currency: member.currency,
      sites: sites.map(s => ({
        siteId: s.siteId, name: s.facts.name, operatorName: s.facts.operatorName, externalId: s.facts.externalId,
        latitude: s.facts.latitudeDeg, longitude: s.facts.longitudeDeg, insuredValue: s.facts.insuredValue, tanks: s.tanks,
        radiusM: s.radiusM, lambdaPerYear: s.lambdaPerYear,
        values: {
          ignitionPerYear: s.figures.ignition.rate, sparkingPerYear: s.figures.sparking.rate, directPerYear: s.figures.direct.rate,
          averageAnnualLoss: s.figures.expectedAnnualLoss.rate, lossAt100Years: s.lossAt100,
        },
        intervals: {
          ignitionPerYear: interval(s.figures.ignition), sparkingPerYear: interval(s.figures.sparking),
          directPerYear: interval(s.figures.direct), averageAnnualLoss: interval(s.figures.expectedAnnualLoss),
        },
      })),
    }
  })
})
