// One result figure from the engine to the page: what a run reports of an event frequency or of the
// average annual loss, whatever table, query, view or export carries it.
import type { CountEstimate, Estimate } from '../engine/types'

/** The event frequencies every result row carries (/yr). */
export const RATE_FIGURES = ['direct', 'sparking', 'ignition'] as const
export type RateFigureName = typeof RATE_FIGURES[number]
/** Every figure of a result row: the three frequencies and the average annual loss (money/yr). */
export type FigureName = RateFigureName | 'expectedAnnualLoss'

/**
 * A result figure: the estimate (`rate`, events per year or money per year) with its 95 % interval,
 * its standard error and, for simulated years, the whole count behind it.
 * - `se`: null where it is not kept (tank rows keep none; `Se` is `number` where it always is).
 * - `count`: simulated-years runs, the simulated count (a whole number; the rate is count / years
 *   and the interval Garwood's on the count); null in frequency mode and for money.
 * - `upperBoundOnly`: stopped by the negligible-rate rule; only `hi` is meant (an upper bound), `lo` is 0.
 */
export interface ResultFigure<Se extends number | null = number | null> {
  rate: number
  lo: number
  hi: number
  se: Se
  count: number | null
  upperBoundOnly: boolean
}

/** An engine estimate (frequency mode, or a mean over simulated years) as a result figure. */
export function figureFromEstimate(e: Estimate): ResultFigure<number> {
  return { rate: e.rate, lo: e.lo, hi: e.hi, se: e.se, count: null, upperBoundOnly: e.upperBoundOnly === true }
}

/** A simulated count over `years` as a result figure: its Garwood interval and the Poisson standard error √n / Y. */
export function figureFromCount(c: CountEstimate, years: number): ResultFigure<number> {
  return { rate: c.rate, lo: c.lo, hi: c.hi, se: Math.sqrt(c.count) / years, count: c.count, upperBoundOnly: false }
}
