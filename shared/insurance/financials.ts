// The financial view of a year-mode run: ground-up, after-terms and insured losses per site and for
// the portfolio, their exceedance summaries, each site's part of the portfolio's tail and risk, and
// the technical premium. Sites' year-loss tables add year by year (the same year index is the same
// simulated year at every site); the allocations are Euler allocations (common practice in capital
// allocation), so the sites' parts add up to the portfolio's figure.
import { lossAtReturnPeriod, sortDescending, summariseYearLosses, tailValueAtRisk, type YearLossSummary } from '../engine/exceedance'
import { technicalPremium, sumBreakdowns, type PremiumBreakdown, type PricingBasis } from './pricing'
import { applySiteTerms, LOSS_PARTS, NO_TERMS, type LossPart, type SiteEvents, type SiteTerms, type YearTable } from './terms'
import { evaluateLayer, type LayerResult, type PortfolioLayer } from './layers'

export interface SiteLosses {
  siteId: string
  events: SiteEvents
  /** null: the site has no terms in the version; its losses count in full (share 100 %). */
  terms: SiteTerms | null
}

export type Measure = 'groundUp' | 'afterTerms' | 'insured'
export const MEASURES: readonly Measure[] = ['groundUp', 'afterTerms', 'insured']

export interface SiteFinancials {
  siteId: string
  hasTerms: boolean
  terms: SiteTerms
  events: number
  averageAnnualLoss: Record<Measure, number>
  /** The same, for property damage and for business interruption (they add up to the total). */
  averageAnnualLossSplit: Record<LossPart, Record<Measure, number>>
  /** Standard deviation of the site's annual insured loss, on its own. */
  insuredStandardDeviation: number
  /** The site's own insured aggregate loss and TVaR at the pricing return period (null when the run is too short). */
  insuredLossAtReturnPeriod: number | null
  insuredTailValueAtRisk: number | null
  /** Share of years with any ground-up loss, and with a loss past the deductibles. */
  lossYearShare: number
  deductibleReachedShare: number
  /** The site's insured loss in the years that make the portfolio's loss at the tail return period, and its TVaR. */
  tail: { lossContribution: number, tailValueAtRiskContribution: number, shareOfTailValueAtRisk: number }
  /** Covariance of the site's annual insured loss with the portfolio's, over the portfolio's σ. */
  standardDeviationContribution: number
  premium: PremiumBreakdown
  /** The premium's lines shared between property damage and interruption by their expected insured loss. */
  premiumSplit: Record<LossPart, PremiumBreakdown>
}

export interface LargestEvent {
  siteId: string, year: number, groundUp: number, afterTerms: number, insured: number
  /** Property-damage parts (business interruption = total − property damage). */
  groundUpPd: number, insuredPd: number
  /** Position of the event in its site's event list. */
  index: number
}

export interface PortfolioFinancials {
  years: number
  summaries: Record<Measure, YearLossSummary>
  /** Property damage and business interruption apart; meaningful only when `hasSplit`. */
  splitSummaries: Record<LossPart, Record<Measure, YearLossSummary>>
  /** False when some site's events were stored before the split (total only: all of it counted as property damage). */
  hasSplit: boolean
  layers: LayerResult[]
  insuredStandardDeviation: number
  tailReturnPeriodYears: number
  insuredLossAtTail: number | null
  insuredTailValueAtRisk: number | null
  sites: SiteFinancials[]
  largestEvents: LargestEvent[]
  premium: PremiumBreakdown
  premiumSplit: Record<LossPart, PremiumBreakdown>
  pricing: PricingBasis
}

const emptyTables = (years: number): Record<Measure, YearTable> => ({
  groundUp: { yearLosses: new Float64Array(years), yearMaxEventLoss: new Float64Array(years) },
  afterTerms: { yearLosses: new Float64Array(years), yearMaxEventLoss: new Float64Array(years) },
  insured: { yearLosses: new Float64Array(years), yearMaxEventLoss: new Float64Array(years) },
})

const summariseTables = (t: Record<Measure, YearTable>): Record<Measure, YearLossSummary> => ({
  groundUp: summariseYearLosses(t.groundUp.yearLosses, t.groundUp.yearMaxEventLoss),
  afterTerms: summariseYearLosses(t.afterTerms.yearLosses, t.afterTerms.yearMaxEventLoss),
  insured: summariseYearLosses(t.insured.yearLosses, t.insured.yearMaxEventLoss),
})

/** A breakdown shared between property damage and interruption in proportion to their expected loss. */
export function splitBreakdown(total: PremiumBreakdown, propertyDamageExpectedLoss: number): Record<LossPart, PremiumBreakdown> {
  const share = total.expectedLoss > 0 ? propertyDamageExpectedLoss / total.expectedLoss : 1
  const part = (f: number): PremiumBreakdown => ({
    expectedLoss: total.expectedLoss * f, riskMeasure: total.riskMeasure * f, riskLoad: total.riskLoad * f,
    expenses: total.expenses * f, profit: total.profit * f, premium: total.premium * f,
  })
  const pd = part(share)
  const bi: PremiumBreakdown = {
    expectedLoss: total.expectedLoss - pd.expectedLoss, riskMeasure: total.riskMeasure - pd.riskMeasure, riskLoad: total.riskLoad - pd.riskLoad,
    expenses: total.expenses - pd.expenses, profit: total.profit - pd.profit, premium: total.premium - pd.premium,
  }
  return { propertyDamage: pd, businessInterruption: bi }
}

interface Sparse { years: Int32Array, losses: Float64Array }

function sparse(yearLosses: Float64Array): Sparse {
  let n = 0
  for (let y = 0; y < yearLosses.length; y++) if (yearLosses[y] !== 0) n++
  const out: Sparse = { years: new Int32Array(n), losses: new Float64Array(n) }
  let k = 0
  for (let y = 0; y < yearLosses.length; y++) {
    if (yearLosses[y] !== 0) { out.years[k] = y; out.losses[k++] = yearLosses[y]! }
  }
  return out
}

function addInto(target: YearTable, source: YearTable) {
  for (let y = 0; y < target.yearLosses.length; y++) {
    target.yearLosses[y]! += source.yearLosses[y]!
    if (source.yearMaxEventLoss[y]! > target.yearMaxEventLoss[y]!) target.yearMaxEventLoss[y] = source.yearMaxEventLoss[y]!
  }
}

function mean(values: Float64Array): number {
  let s = 0
  for (let i = 0; i < values.length; i++) s += values[i]!
  return values.length ? s / values.length : 0
}

/** Sample standard deviation (n − 1), as the engine's average-annual-loss standard error uses. */
export function standardDeviation(values: Float64Array): number {
  const n = values.length
  if (n < 2) return 0
  const m = mean(values)
  let s = 0
  for (let i = 0; i < n; i++) s += (values[i]! - m) ** 2
  return Math.sqrt(s / (n - 1))
}

/**
 * Weights of the years behind the portfolio's loss at return period T and behind its TVaR: years
 * ranked by the portfolio's loss (largest first, earlier year first on ties), with the same
 * interpolation as the engine's lossAtReturnPeriod and tailValueAtRisk. A site's contribution is
 * its loss in those years with those weights; the contributions add up to the portfolio figure.
 */
export function tailWeights(portfolioYearLosses: Float64Array, returnPeriodYears: number): { loss: Map<number, number>, tvar: Map<number, number> } | null {
  const years = portfolioYearLosses.length
  const k = years / returnPeriodYears
  if (k < 1) return null
  const order = Array.from({ length: years }, (_, y) => y)
  order.sort((a, b) => (portfolioYearLosses[b]! - portfolioYearLosses[a]!) || (a - b))
  const lower = Math.floor(k)
  const frac = k - lower
  const loss = new Map<number, number>()
  if (frac === 0 || lower >= years) loss.set(order[lower - 1]!, 1)
  else { loss.set(order[lower - 1]!, 1 - frac); loss.set(order[lower]!, frac) }
  const tvar = new Map<number, number>()
  for (let i = 0; i < lower; i++) tvar.set(order[i]!, 1 / k)
  if (lower < years && frac > 0) tvar.set(order[lower]!, frac / k)
  return { loss, tvar }
}

const weighted = (s: Sparse, w: Map<number, number>) => {
  let sum = 0
  for (let i = 0; i < s.years.length; i++) sum += (w.get(s.years[i]!) ?? 0) * s.losses[i]!
  return sum
}

/**
 * The whole financial view. `largest` limits the list of largest events; `layers` are priced on
 * the portfolio's insured events (after every site's terms and share).
 */
export function computeFinancials(sites: readonly SiteLosses[], years: number, pricing: PricingBasis, largest = 50, layers: readonly PortfolioLayer[] = []): PortfolioFinancials {
  if (pricing.returnPeriodYears > years) throw new RangeError(`a return period of ${pricing.returnPeriodYears} years needs at least as many simulated years (the run has ${years})`)
  const portfolio = emptyTables(years)
  const portfolioSplit: Record<LossPart, Record<Measure, YearTable>> = { propertyDamage: emptyTables(years), businessInterruption: emptyTables(years) }
  const partial: (Omit<SiteFinancials, 'tail' | 'standardDeviationContribution' | 'premium' | 'premiumSplit'> & { insuredYears: Sparse })[] = []
  let events: LargestEvent[] = []
  const insuredEventYear: number[] = []
  const insuredEventLoss: number[] = []
  let hasSplit = true
  for (const site of sites) {
    const terms = { ...NO_TERMS, ...(site.terms ?? {}) }
    const t = applySiteTerms(site.events, years, terms)
    if (!site.events.propertyDamage && site.events.year.length > 0) hasSplit = false
    for (const m of MEASURES) {
      addInto(portfolio[m], t[m])
      for (const part of LOSS_PARTS) addInto(portfolioSplit[part][m], t.split[part][m])
    }
    const splitMeans = (part: LossPart) => ({ groundUp: mean(t.split[part].groundUp.yearLosses), afterTerms: mean(t.split[part].afterTerms.yearLosses), insured: mean(t.split[part].insured.yearLosses) })
    const sorted = sortDescending(t.insured.yearLosses)
    partial.push({
      siteId: site.siteId, hasTerms: site.terms !== null, terms: { ...terms }, events: site.events.year.length,
      averageAnnualLoss: { groundUp: mean(t.groundUp.yearLosses), afterTerms: mean(t.afterTerms.yearLosses), insured: mean(t.insured.yearLosses) },
      averageAnnualLossSplit: { propertyDamage: splitMeans('propertyDamage'), businessInterruption: splitMeans('businessInterruption') },
      insuredStandardDeviation: standardDeviation(t.insured.yearLosses),
      insuredLossAtReturnPeriod: lossAtReturnPeriod(sorted, pricing.returnPeriodYears),
      insuredTailValueAtRisk: tailValueAtRisk(sorted, pricing.returnPeriodYears),
      lossYearShare: years ? t.lossYears / years : 0,
      deductibleReachedShare: years ? t.deductibleReachedYears / years : 0,
      insuredYears: sparse(t.insured.yearLosses),
    })
    const pdOf = site.events.propertyDamage ?? site.events.loss
    for (let k = 0; k < site.events.year.length; k++) {
      events.push({ siteId: site.siteId, year: site.events.year[k]!, groundUp: site.events.loss[k]!, afterTerms: t.eventAfterTerms[k]!, insured: t.eventInsured[k]!, groundUpPd: pdOf[k]!, insuredPd: t.eventInsuredPd[k]!, index: k })
      if (t.eventInsured[k]! > 0) { insuredEventYear.push(site.events.year[k]!); insuredEventLoss.push(t.eventInsured[k]!) }
    }
    if (events.length > 20 * largest + 1000) events = topEvents(events, largest)
  }
  const summaries = summariseTables(portfolio)
  const splitSummaries = { propertyDamage: summariseTables(portfolioSplit.propertyDamage), businessInterruption: summariseTables(portfolioSplit.businessInterruption) }
  const S = portfolio.insured.yearLosses
  const meanS = mean(S)
  const sigmaS = standardDeviation(S)
  const weights = tailWeights(S, pricing.returnPeriodYears)!
  const sortedS = sortDescending(S)
  const portfolioTvar = tailValueAtRisk(sortedS, pricing.returnPeriodYears)
  const out: SiteFinancials[] = partial.map(({ insuredYears, ...site }) => {
    let cross = 0
    for (let i = 0; i < insuredYears.years.length; i++) cross += insuredYears.losses[i]! * S[insuredYears.years[i]!]!
    const covariance = years > 1 ? (cross - years * site.averageAnnualLoss.insured * meanS) / (years - 1) : 0
    const standardDeviationContribution = sigmaS > 0 ? covariance / sigmaS : 0
    const tvarContribution = weighted(insuredYears, weights.tvar)
    const tail = {
      lossContribution: weighted(insuredYears, weights.loss),
      tailValueAtRiskContribution: tvarContribution,
      shareOfTailValueAtRisk: portfolioTvar ? tvarContribution / portfolioTvar : 0,
    }
    const riskMeasure = pricing.method === 'std_dev' ? standardDeviationContribution
      : pricing.method === 'tvar' ? tvarContribution
        : tvarContribution - site.averageAnnualLoss.insured
    const premium = technicalPremium(site.averageAnnualLoss.insured, riskMeasure, pricing)
    return { ...site, tail, standardDeviationContribution, premium, premiumSplit: splitBreakdown(premium, site.averageAnnualLossSplit.propertyDamage.insured) }
  })
  const premium = sumBreakdowns(out.map(s => s.premium))
  const portfolioEvents = { year: Int32Array.from(insuredEventYear), loss: Float64Array.from(insuredEventLoss) }
  return {
    years, summaries, splitSummaries, hasSplit,
    layers: layers.map(l => evaluateLayer(l, portfolioEvents, years, pricing)),
    insuredStandardDeviation: sigmaS,
    tailReturnPeriodYears: pricing.returnPeriodYears,
    insuredLossAtTail: lossAtReturnPeriod(sortedS, pricing.returnPeriodYears),
    insuredTailValueAtRisk: portfolioTvar,
    sites: out,
    largestEvents: topEvents(events, largest),
    premium,
    premiumSplit: {
      propertyDamage: sumBreakdowns(out.map(s => s.premiumSplit.propertyDamage)),
      businessInterruption: sumBreakdowns(out.map(s => s.premiumSplit.businessInterruption)),
    },
    pricing: { ...pricing },
  }
}

function topEvents(events: LargestEvent[], n: number): LargestEvent[] {
  return events.sort((a, b) => (b.groundUp - a.groundUp) || (a.year - b.year) || a.siteId.localeCompare(b.siteId)).slice(0, n)
}
