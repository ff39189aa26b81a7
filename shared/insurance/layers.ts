// Layers on the portfolio's insured loss (the loss after every site's terms and share): a
// per-occurrence excess-of-loss layer pays on each event, an annual aggregate layer on each year's
// total; both pay min(limit, max(0, loss − attachment)) (common practice for excess-of-loss
// covers; no reinstatements, no aggregate cap on an occurrence layer). Priced by the same rule as
// the sites (pricing.ts), on the layer's own annual losses, from the stored events.
import { lossAtReturnPeriod, sortDescending, summariseYearLosses, tailValueAtRisk, type YearLossSummary } from '../engine/exceedance'
import { technicalPremium, type PremiumBreakdown, type PricingBasis } from './pricing'

export type LayerKind = 'occurrence' | 'aggregate'
export const LAYER_KINDS: readonly LayerKind[] = ['occurrence', 'aggregate']

export interface PortfolioLayer {
  name: string
  kind: LayerKind
  /** Loss (per event or per year) the layer sits above, money ≥ 0. */
  attachment: number
  /** Most the layer pays per event (occurrence) or per year (aggregate); null = unlimited. */
  limit: number | null
}

/** The portfolio's insured events: year and insured loss of each, in any order. */
export interface PortfolioEvents { year: ArrayLike<number>, loss: ArrayLike<number> }

export interface LayerResult {
  layer: PortfolioLayer
  /** Mean annual loss to the layer. */
  expectedLoss: number
  /** Share of simulated years in which the layer pays something. */
  attachmentProbability: number
  /** Share of simulated years in which the layer pays its full limit (per event or for the year); 0 when unlimited. */
  exhaustionProbability: number
  standardDeviation: number
  lossAtReturnPeriod: number | null
  tailValueAtRisk: number | null
  /** Annual layer losses as a year-loss summary (aggregate and occurrence curves of the layer). */
  summary: YearLossSummary
  premium: PremiumBreakdown
}

/** What a layer pays on a loss x. */
export function layerPays(x: number, attachment: number, limit: number | null): number {
  const over = Math.max(0, x - attachment)
  return limit === null ? over : Math.min(limit, over)
}

function stdDev(values: Float64Array, mean: number): number {
  const n = values.length
  if (n < 2) return 0
  let s = 0
  for (let i = 0; i < n; i++) s += (values[i]! - mean) ** 2
  return Math.sqrt(s / (n - 1))
}

/** One layer on the portfolio's insured events over `years` simulated years. */
export function evaluateLayer(layer: PortfolioLayer, events: PortfolioEvents, years: number, pricing: PricingBasis): LayerResult {
  const n = events.year.length
  if (events.loss.length !== n) throw new RangeError('every event needs a year and a loss')
  const yearLosses = new Float64Array(years)
  const yearMaxEventLoss = new Float64Array(years)
  const exhausted = new Uint8Array(years)
  const top = layer.limit === null ? Infinity : layer.attachment + layer.limit
  if (layer.kind === 'occurrence') {
    for (let k = 0; k < n; k++) {
      const y = events.year[k]!
      const x = events.loss[k]!
      const paid = layerPays(x, layer.attachment, layer.limit)
      yearLosses[y]! += paid
      if (paid > yearMaxEventLoss[y]!) yearMaxEventLoss[y] = paid
      if (x >= top) exhausted[y] = 1
    }
  } else {
    const total = new Float64Array(years)
    for (let k = 0; k < n; k++) total[events.year[k]!]! += events.loss[k]!
    for (let y = 0; y < years; y++) {
      const paid = layerPays(total[y]!, layer.attachment, layer.limit)
      yearLosses[y] = paid
      yearMaxEventLoss[y] = paid
      if (total[y]! >= top) exhausted[y] = 1
    }
  }
  let sum = 0
  let attached = 0
  let exhaustedYears = 0
  for (let y = 0; y < years; y++) {
    sum += yearLosses[y]!
    if (yearLosses[y]! > 0) attached += 1
    exhaustedYears += exhausted[y]!
  }
  const expectedLoss = years ? sum / years : 0
  const standardDeviation = stdDev(yearLosses, expectedLoss)
  const sorted = sortDescending(yearLosses)
  const T = pricing.returnPeriodYears
  const tvar = tailValueAtRisk(sorted, T)
  const riskMeasure = pricing.method === 'std_dev' ? standardDeviation
    : pricing.method === 'tvar' ? (tvar ?? 0)
      : Math.max(0, (tvar ?? 0) - expectedLoss)
  return {
    layer: { ...layer },
    expectedLoss,
    attachmentProbability: years ? attached / years : 0,
    exhaustionProbability: years ? exhaustedYears / years : 0,
    standardDeviation,
    lossAtReturnPeriod: lossAtReturnPeriod(sorted, T),
    tailValueAtRisk: tvar,
    summary: summariseYearLosses(yearLosses, yearMaxEventLoss),
    premium: technicalPremium(expectedLoss, riskMeasure, pricing),
  }
}

/** Checks a layer a person entered; a message per field, empty when valid. */
export function layerProblems(layer: PortfolioLayer): Partial<Record<keyof PortfolioLayer, string>> {
  const problems: Partial<Record<keyof PortfolioLayer, string>> = {}
  if (!layer.name.trim()) problems.name = 'Give the layer a name.'
  if (!(Number.isFinite(layer.attachment) && layer.attachment >= 0)) problems.attachment = 'The attachment is an amount of 0 or more.'
  if (layer.limit !== null && !(Number.isFinite(layer.limit) && layer.limit > 0)) problems.limit = 'The limit is more than 0, or empty for no limit.'
  return problems
}
