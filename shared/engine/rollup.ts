// Portfolio roll-ups: frequency sums with intervals, the tanks that drive the total, and the
// portfolio year-loss table.
import type { Estimate } from './types'
import type { SiteFrequencyResult } from './frequency'
import type { SiteYearResult } from './years'
import type { YearLossSummary, YearLossTable } from './exceedance'
import { sumEstimates } from './statistics'
import { combineYearLossTables, summariseYearLosses } from './exceedance'

export interface FrequencyDriver { siteId: string; tankId: string; tag: string; expectedAnnualLoss: number; ignitionPerYear: number; share: number }

export interface FrequencyRollUp {
  siteCount: number
  tankCount: number
  totals: { direct: Estimate; sparking: Estimate; ignition: Estimate; expectedAnnualLoss: Estimate }
  /** Tanks ranked by expected annual loss, with their share of the total. */
  drivers: FrequencyDriver[]
}

/** Sum site results (independent streams: variances add) and rank the tanks that drive the total. */
export function rollUpFrequency(siteResults: readonly SiteFrequencyResult[], topDrivers = 20): FrequencyRollUp {
  // Sums in site-id order: floating-point addition is not associative, and the portfolio figure
  // must not depend on the order in which chunks came back.
  const sites = [...siteResults].sort((a, b) => (a.siteId < b.siteId ? -1 : a.siteId > b.siteId ? 1 : 0))
  const tanks = sites.flatMap((s) => s.tanks.map((t) => ({ siteId: s.siteId, t })))
  const totals = {
    direct: sumEstimates(sites.map((s) => s.totals.direct)),
    sparking: sumEstimates(sites.map((s) => s.totals.sparking)),
    ignition: sumEstimates(sites.map((s) => s.totals.ignition)),
    expectedAnnualLoss: sumEstimates(sites.map((s) => s.totals.expectedAnnualLoss)),
  }
  const eal = totals.expectedAnnualLoss.rate
  const drivers = tanks
    .map(({ siteId, t }) => ({ siteId, tankId: t.tankId, tag: t.tag, expectedAnnualLoss: t.expectedAnnualLoss.rate, ignitionPerYear: t.ignition.rate, share: eal > 0 ? t.expectedAnnualLoss.rate / eal : 0 }))
    .sort((a, b) => b.expectedAnnualLoss - a.expectedAnnualLoss || a.siteId.localeCompare(b.siteId) || a.tankId.localeCompare(b.tankId))
    .slice(0, topDrivers)
  return { siteCount: sites.length, tankCount: tanks.length, totals, drivers }
}

export interface YearRollUp extends YearLossTable { summary: YearLossSummary }

/**
 * Portfolio year-loss table and its summary from site year results of one run (same years), added
 * in site-id order when ids are given so the result does not depend on chunk order.
 */
export function rollUpYears(siteResults: readonly (Pick<SiteYearResult, 'yearLosses' | 'yearMaxEventLoss'> & { siteId?: string })[]): YearRollUp {
  const sites = [...siteResults].sort((a, b) => ((a.siteId ?? '') < (b.siteId ?? '') ? -1 : (a.siteId ?? '') > (b.siteId ?? '') ? 1 : 0))
  const table = combineYearLossTables(sites)
  return { ...table, summary: summariseYearLosses(table.yearLosses, table.yearMaxEventLoss) }
}
