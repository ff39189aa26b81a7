// Assumption bands for simulated-years runs (issue "How sure are we", point 2).
//
// Each band draw k (row k of the plan's matrix A) re-simulates the site's years under its drawn
// assumption set, with the site's flash density × the draw's flash-density factor, on the SAME
// random streams as the central re-simulation (same run seed, same site, same stream names: common
// random numbers). Both use a bounded number of years, Y_d = min(run years, DRAW_YEARS). A figure's
// band value for draw k is the run's central figure (all run years, unchanged) × X_k / X_0, where
// X_0 is the same figure from the central assumptions re-simulated over the same Y_d years on the
// same streams: the ratio carries the assumptions' effect, the central figure its level.
//
// The figures: average annual loss, expected fires (ignitions per year) and the aggregate and
// occurrence losses at every return period the run reports. A return period longer than Y_d has no
// re-simulated value (null band). A figure with X_0 = 0 (no loss in the Y_d years at the central
// assumptions) has no ratio: its band is null, never a guess.
//
// Exactly what holds: with the same streams, an evaluation whose assumptions and factor equal the
// central ones gives X_k = X_0 bit for bit, so its band value is the central figure; and the
// site's values depend only on (site, plan, seed, years), never on how sites are grouped in chunks.
// With only the flash-density factor f uncertain, E[X_k] = f_k · E[X_0] for the average annual loss
// and the expected fires (a Poisson process of rate f·λ), so the ratios scatter about f_k with the
// Poisson error of Y_d years — the streams do not stay aligned once the candidate counts differ,
// which is the price of re-simulating instead of re-weighting.
import type { AssumptionDraw, DrawPlan } from './draws'
import type { SiteInput } from './types'
import type { SiteClustering } from './storm-clusters'
import { simulateSiteYears } from './years'
import { STANDARD_RETURN_PERIODS } from './exceedance'
import { bandOf, type DrawBand } from './draw-figures'

/** Years re-simulated per draw (at most the run's years). */
export const DRAW_YEARS = 2000

export interface YearDrawFigures {
  /** Tank events per year: direct strikes and induced sparking (optional: the bands of a run's four figures). */
  direct?: number
  sparking?: number
  averageAnnualLoss: number
  /** Ignitions (tank fires, spread included) per year. */
  expectedFires: number
  /** Aggregate and occurrence loss at each return period (null where Y_d is shorter than T). */
  aggregate: (number | null)[]
  occurrence: (number | null)[]
}

export interface SiteYearDrawValues {
  years: number
  returnPeriods: readonly number[]
  /** Index 0: the central assumptions over Y_d years; 1…K: the band draws. */
  evaluations: YearDrawFigures[]
  /** Per evaluation, its year-loss table over the Y_d years (the portfolio adds them year by year). */
  tables: { yearLosses: Float64Array; yearMaxEventLoss: Float64Array }[]
}

function figuresOf(site: SiteInput, draw: AssumptionDraw, options: { runSeed: number | string; years: number; clustering: SiteClustering | null }, periods: readonly number[]): { figures: YearDrawFigures; table: { yearLosses: Float64Array; yearMaxEventLoss: Float64Array } } {
  const scaled = draw.flashDensityFactor === 1 ? site : { ...site, flashDensity: site.flashDensity * draw.flashDensityFactor }
  const r = simulateSiteYears(scaled, draw.assumptions, { runSeed: options.runSeed, years: options.years, clustering: options.clustering })
  const at = (table: typeof r.summary.aggregate) => periods.map(T => table.find(p => p.returnPeriodYears === T)?.loss ?? null)
  const figures = {
    direct: r.totals.direct.rate,
    sparking: r.totals.sparking.rate,
    averageAnnualLoss: r.summary.averageAnnualLoss,
    expectedFires: r.totals.ignition.rate,
    aggregate: at(r.summary.aggregate),
    occurrence: at(r.summary.occurrence),
  }
  return { figures, table: { yearLosses: r.yearLosses, yearMaxEventLoss: r.yearMaxEventLoss } }
}

/**
 * The site's figures at the central assumptions and at every band draw of the plan, each over
 * Y_d = min(years, drawYears) years on the same streams. Deterministic in (site, plan, seed, years).
 * Storm clustering: refused when the flash-density factor is drawn (a drawn density above the
 * run's storm field λmax has no storms to come from); other assumptions are drawn as without it.
 */
export function siteYearDrawValues(site: SiteInput, plan: DrawPlan, options: { runSeed: number | string; years: number; clustering?: SiteClustering | null; drawYears?: number; returnPeriods?: readonly number[] }): SiteYearDrawValues {
  const years = Math.min(options.years, options.drawYears ?? DRAW_YEARS)
  const clustering = options.clustering ?? null
  if (clustering && plan.entries.some(e => e.path === 'flashDensityFactor')) {
    throw new RangeError('storm clustering with an uncertain flash-density factor: the run\'s storm field is fixed at the central densities; draw the factor without clustering')
  }
  const periods = options.returnPeriods ?? STANDARD_RETURN_PERIODS
  const run = { runSeed: options.runSeed, years, clustering }
  const out = [plan.central, ...plan.a].map(d => figuresOf(site, d, run, periods))
  return { years, returnPeriods: periods, evaluations: out.map(o => o.figures), tables: out.map(o => o.table) }
}

export interface YearDrawBands {
  draws: number
  /** Years re-simulated per draw. */
  years: number
  averageAnnualLoss: DrawBand | null
  expectedFires: DrawBand | null
  aggregate: { returnPeriodYears: number; band: DrawBand | null }[]
  occurrence: { returnPeriodYears: number; band: DrawBand | null }[]
}

/** central × X_k / X_0 for k = 1…K, or null when X_0 (or the central figure) is missing or X_0 is 0. */
export function ratioSeries(central: number | null, x: readonly (number | null)[]): Float64Array | null {
  const x0 = x[0]
  if (central === null || x0 === null || x0 === undefined || !(x0 > 0)) return null
  const out = new Float64Array(x.length - 1)
  for (let k = 1; k < x.length; k++) {
    const v = x[k]
    if (v === null || v === undefined) return null
    out[k - 1] = central * (v / x0)
  }
  return out
}

const bandOrNull = (s: Float64Array | null): DrawBand | null => (s ? bandOf(s) : null)

/** Bands anchored on the run's central figures (all its years). */
export function yearDrawBands(v: SiteYearDrawValues, central: YearDrawFigures): YearDrawBands {
  const E = v.evaluations
  return {
    draws: E.length - 1,
    years: v.years,
    averageAnnualLoss: bandOrNull(ratioSeries(central.averageAnnualLoss, E.map(e => e.averageAnnualLoss))),
    expectedFires: bandOrNull(ratioSeries(central.expectedFires, E.map(e => e.expectedFires))),
    aggregate: v.returnPeriods.map((T, i) => ({ returnPeriodYears: T, band: bandOrNull(ratioSeries(central.aggregate[i] ?? null, E.map(e => e.aggregate[i] ?? null))) })),
    occurrence: v.returnPeriods.map((T, i) => ({ returnPeriodYears: T, band: bandOrNull(ratioSeries(central.occurrence[i] ?? null, E.map(e => e.occurrence[i] ?? null))) })),
  }
}
