// GET /api/runs/:id/dashboard — headline figures with intervals, exceedance curves and what drives
// the total (top sites and tanks by expected fires) for a succeeded run.
import { accumulationOf, exceedanceSeries, findSucceededRun, headline, portfolioResult, topSites, topTanks } from '~~/server/results/queries'
import { cachedJson } from '~~/server/results/cache'

const DRIVERS = 10

export default defineEventHandler(async (event) => {
  const member = await requireMembership(event)
  const id = readId(event, 'Results of this run')
  const run = await findSucceededRun(member.organisationId, id)
  if (!run) notFound('Results of this run')
  // Serialised once per run and currency (server/results/cache.ts), sent as it is.
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  return cachedJson(`dashboard:${run.id}:${member.currency}`, async () => {
    const [portfolio, sites, tanks] = await Promise.all([portfolioResult(run.id), topSites(run.id, DRIVERS), topTanks(run.id, DRIVERS)])
    if (!portfolio) notFound('Results of this run')
    const summary = portfolio.yearSummary
    return {
      run: { id: run.id, mode: run.mode, stormClustering: run.stormClustering, seed: run.seed, portfolioId: run.portfolioId, portfolioName: run.portfolioName, finishedAt: run.finishedAt, years: run.years, engineVersion: run.engineVersion, inputHash: run.inputHash, assumptionDraws: run.assumptionDraws },
      currency: member.currency,
      headline: headline(portfolio.figures, portfolio.lossSplit, summary),
      /** Assumption uncertainty: 5/50/95 % across K draws and the sensitivity indices; null: no assumption draws. */
      assumptionBands: portfolio.draws ? { draws: portfolio.draws.draws, bands: portfolio.draws.bands, sensitivity: portfolio.draws.sensitivity, leftOut: portfolio.draws.leftOut ?? [], ...(portfolio.draws.years ? { years: portfolio.draws.years } : {}) } : null,
      exceedance: exceedanceSeries(summary, run.portfolioName),
      accumulation: accumulationOf(summary),
      returnPeriods: summary ? { aggregate: summary.aggregate, occurrence: summary.occurrence, intervals: summary.intervals ?? null } : null,
      drivers: {
        metric: 'ignitionPerYear',
        total: portfolio.figures.ignition.rate,
        sites: sites.map(s => ({ id: s.siteId, label: s.name, kind: 'site' as const, value: s.ignitionRate, detail: `${s.operatorName} · ${s.tanks} tanks`, to: `/results/${run.id}/sites/${s.siteId}` })),
        tanks: tanks.map(t => ({ id: t.tankId, label: t.tag, kind: 'tank' as const, value: t.ignitionRate, detail: t.siteName, to: `/results/${run.id}/sites/${t.siteId}#tank-${t.tankId}` })),
      },
    }
  })
})
