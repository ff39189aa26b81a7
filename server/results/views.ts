// The answers of the run result routes that are kept as stored documents (server/results/documents.ts):
// GET /api/runs/:id/dashboard and GET /api/runs/:id/sites. Built here from the stored results, so the
// route, the run's end (server/runs) and the tests build the same document.
import type { ResultFigure } from '../../shared/results/figure'
import { accumulationOf, exceedanceSeries, headline, portfolioResult, siteResults, topSites, topTanks, type RunRow } from './queries'

const DRIVERS = 10

/**
 * The format of each stored view: raise it when the view's shape or content changes, so documents
 * stored by an older build are rebuilt on their next read instead of being served.
 */
export const VIEW_FORMATS = { dashboard: 1, sites: 1 } as const
export type ResultView = keyof typeof VIEW_FORMATS

type RunFacts = Pick<RunRow, 'id' | 'mode' | 'stormClustering' | 'seed' | 'portfolioId' | 'finishedAt' | 'years' | 'engineVersion' | 'inputHash' | 'assumptionDraws' | 'portfolioName'>

/** Headline figures with intervals, exceedance curves and what drives the total; null: the run has no portfolio result. */
export async function dashboardView(run: RunFacts, currency: string) {
  const [portfolio, sites, tanks] = await Promise.all([portfolioResult(run.id), topSites(run.id, DRIVERS), topTanks(run.id, DRIVERS)])
  if (!portfolio) return null
  const summary = portfolio.yearSummary
  return {
    run: { id: run.id, mode: run.mode, stormClustering: run.stormClustering, seed: run.seed, portfolioId: run.portfolioId, portfolioName: run.portfolioName, finishedAt: run.finishedAt, years: run.years, engineVersion: run.engineVersion, inputHash: run.inputHash, assumptionDraws: run.assumptionDraws },
    currency,
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
}
export type DashboardView = NonNullable<Awaited<ReturnType<typeof dashboardView>>>

const interval = (f: ResultFigure): [number, number] => [f.lo, f.hi]

/** Every site of the run with its figures, coordinates and insured value (map, heatmap, site table). */
export async function siteListView(run: Pick<RunRow, 'id'>, currency: string) {
  const sites = await siteResults(run.id)
  return {
    currency,
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
}
export type SiteListView = Awaited<ReturnType<typeof siteListView>>
