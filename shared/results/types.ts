// Shapes the result components draw. The runs layer maps stored results to these; the components
// know nothing about where the figures come from. Units: frequencies per year, money in the
// organisation's currency, current in kA, distance in m.

/**
 * A figure with its 95 % interval; lo/hi are null when the figure has no interval. `upperBoundOnly`:
 * stopped by the negligible-rate rule, only `hi` (an upper bound) is meant.
 */
export interface RangedFigure { value: number; lo: number | null; hi: number | null; upperBoundOnly?: boolean }

/** One point of an exceedance curve: the loss exceeded once in `returnPeriodYears` on average. */
export interface ExceedancePoint { returnPeriodYears: number; loss: number }

/** Aggregate: total loss in a year; occurrence: the largest single event in a year. */
export type ExceedanceKind = 'aggregate' | 'occurrence'

export interface ExceedanceSeries {
  /** Shown in the legend, e.g. "Portfolio" or a site's name when comparing sites. */
  name: string
  kind: ExceedanceKind
  points: ExceedancePoint[]
}

/** The headline figures of a portfolio, a site or a tank for one run. */
export interface HeadlineFigures {
  ignitionPerYear: RangedFigure
  sparkingPerYear: RangedFigure
  directPerYear: RangedFigure
  averageAnnualLoss: RangedFigure
  lossAt100Years: RangedFigure
  lossAt250Years: RangedFigure
  /** Mean of the losses beyond the `tailReturnPeriodYears` loss (tail value-at-risk). */
  tailValueAtRisk: RangedFigure
  tailReturnPeriodYears: number
  /**
   * The average annual loss as property damage (replacement + contents + clean-up) and business
   * interruption; null for runs made before the split (total only). Absent: not applicable.
   */
  averageAnnualLossSplit?: { propertyDamage: number; businessInterruption: number } | null
}

/** How a metric's values are written: with "/yr" and "once in N years", as money, or as a share. */
export type MetricFormat = 'frequency' | 'money' | 'share' | 'number'

export interface MetricDef {
  key: string
  label: string
  format: MetricFormat
  /** Unit text for 'number' metrics (frequency and money carry their own). */
  unit?: string
  /** Colour on a log scale: right for frequencies and losses spanning several orders of magnitude. */
  logScale?: boolean
}

/** A site with its metric values (null: no value, e.g. the site was not in the run). */
export interface SiteMetricRow { siteId: string; siteName: string; values: Record<string, number | null> }

/** A tank or site that contributes to the total, with the figure it contributes. */
export interface DriverInput {
  id: string
  label: string
  kind: 'site' | 'tank'
  value: number
  /** Extra line under the label, e.g. the tank's site and contents. */
  detail?: string
  /** Link target, e.g. /sites/<id>. */
  to?: string
}

/** A site on the map. */
export interface MapSite {
  id: string
  name: string
  latitude: number
  longitude: number
  /** Sum of the tanks' severities (replacement + contents + clean-up + interruption). */
  insuredValue: number
  values: Record<string, number | null>
}

/**
 * A tank's sparking probability over stroke current × distance (MODEL.md §3–§4), with the distance
 * inside which a flash of each current strikes the tank itself (MODEL.md §2).
 */
export interface TankSparkingGrid {
  currentsKa: number[]
  distancesM: number[]
  /** probability[i][j]: current i, distance j. */
  probability: number[][]
  /** directStrikeDistanceM[i]: the farthest grid distance at which flashes of current i strike the tank (0: none). */
  directStrikeDistanceM: number[]
  /** directZone[i][j]: flashes of current i at distance j strike the tank (the engine's own cells, when known). */
  directZone?: boolean[][]
}

/** A site's events (sparking, direct strikes) by stroke-current band × distance band. */
export interface EventBands {
  /** Band edges in kA (n + 1 edges for n bands); the last edge may be Infinity. */
  currentEdgesKa: number[]
  /** Band edges in m. */
  distanceEdgesM: number[]
  /** values[i][j]: events per year (or counts) in current band i and distance band j. */
  values: number[][]
}
