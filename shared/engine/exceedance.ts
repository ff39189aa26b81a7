// Year-loss table statistics (MODEL.md §5): average annual loss, occurrence and aggregate
// exceedance, losses at return periods, tail value-at-risk. They work on any year-loss table —
// one site, or a portfolio built by adding site tables year by year.

export const STANDARD_RETURN_PERIODS: readonly number[] = [10, 25, 50, 100, 250, 500, 1000]

export interface ReturnPeriodLoss {
  returnPeriodYears: number
  /** Loss exceeded on average once in T years; null when the table is shorter than T years. */
  loss: number | null
  /** Mean loss of the worst Y/T years (tail value-at-risk at level 1 − 1/T); null like `loss`. */
  tailValueAtRisk: number | null
}

export interface ExceedancePoint { exceedanceProbability: number; returnPeriodYears: number; loss: number }

export interface YearLossSummary {
  years: number
  averageAnnualLoss: number
  averageAnnualLossSe: number
  /** Share of years with any loss. */
  lossYearShare: number
  aggregate: ReturnPeriodLoss[]
  occurrence: ReturnPeriodLoss[]
  aggregateCurve: ExceedancePoint[]
  occurrenceCurve: ExceedancePoint[]
}

/**
 * A year-loss column sorted largest first, stored compactly: most simulated years have no loss, so
 * only the non-zero losses are kept and sorted; the remaining years are zeros.
 */
interface SortedLosses { top: Float64Array; years: number }

function sortLosses(losses: ArrayLike<number>): SortedLosses {
  const n = losses.length
  let nonZero = 0
  for (let i = 0; i < n; i++) if (losses[i] !== 0) nonZero += 1
  const values = new Float64Array(nonZero)
  let k = 0
  for (let i = 0; i < n; i++) if (losses[i] !== 0) values[k++] = losses[i]!
  values.sort().reverse()
  return { top: values, years: n }
}

/** Losses sorted largest first (a full-length copy). */
export function sortDescending(losses: ArrayLike<number>): Float64Array {
  const { top, years } = sortLosses(losses)
  const out = new Float64Array(years)
  out.set(top)
  return out
}

/** The value of rank i (0-based, largest first). */
function ranked(s: SortedLosses, i: number): number {
  return i < s.top.length ? s.top[i]! : 0
}

function lossAtRank(s: SortedLosses, returnPeriodYears: number): number | null {
  const k = s.years / returnPeriodYears
  if (k < 1) return null
  const lower = Math.floor(k)
  const frac = k - lower
  const a = ranked(s, lower - 1)
  return frac === 0 || lower >= s.years ? a : a + frac * (ranked(s, lower) - a)
}

function tvarAtRank(s: SortedLosses, returnPeriodYears: number): number | null {
  const k = s.years / returnPeriodYears
  if (k < 1) return null
  const whole = Math.floor(k)
  let sum = 0
  for (let i = 0; i < Math.min(whole, s.top.length); i++) sum += s.top[i]!
  if (whole < s.years) sum += (k - whole) * ranked(s, whole)
  return sum / k
}

/**
 * Loss at return period T from losses sorted largest first: the k-th largest with k = Y/T (its
 * empirical exceedance probability k/Y = 1/T), interpolating between ranks when Y/T is not whole
 * (common practice in catastrophe modelling). Null when Y < T: the table cannot say.
 */
export function lossAtReturnPeriod(sortedDesc: Float64Array, returnPeriodYears: number): number | null {
  return lossAtRank({ top: sortedDesc, years: sortedDesc.length }, returnPeriodYears)
}

/** Tail value-at-risk at return period T: mean of the worst k = Y/T years (a fractional year counts in part). */
export function tailValueAtRisk(sortedDesc: Float64Array, returnPeriodYears: number): number | null {
  return tvarAtRank({ top: sortedDesc, years: sortedDesc.length }, returnPeriodYears)
}

/** Points of an exceedance curve at log-spaced return periods from 1 year to the table length. */
export function exceedanceCurve(sortedDesc: Float64Array, points = 60): ExceedancePoint[] {
  return curveOf({ top: sortedDesc, years: sortedDesc.length }, points)
}

function curveOf(s: SortedLosses, points = 60): ExceedancePoint[] {
  if (s.years === 0) return []
  const out: ExceedancePoint[] = []
  const top = Math.log(s.years)
  for (let i = 0; i < points; i++) {
    const T = Math.exp(top * i / Math.max(1, points - 1))
    const loss = lossAtRank(s, T)
    if (loss !== null) out.push({ exceedanceProbability: 1 / T, returnPeriodYears: T, loss })
  }
  return out
}

function returnPeriodTable(s: SortedLosses, periods: readonly number[]): ReturnPeriodLoss[] {
  return periods.map((T) => ({ returnPeriodYears: T, loss: lossAtRank(s, T), tailValueAtRisk: tvarAtRank(s, T) }))
}

/**
 * Summary of a year-loss table: `yearLosses` (aggregate loss per simulated year) and
 * `yearMaxEventLoss` (largest single event per year, for the occurrence curve).
 */
export function summariseYearLosses(yearLosses: ArrayLike<number>, yearMaxEventLoss: ArrayLike<number>, returnPeriods: readonly number[] = STANDARD_RETURN_PERIODS): YearLossSummary {
  const years = yearLosses.length
  let sum = 0
  let sum2 = 0
  let lossYears = 0
  for (let y = 0; y < years; y++) {
    const l = yearLosses[y]!
    sum += l
    sum2 += l * l
    if (l > 0) lossYears += 1
  }
  const mean = years > 0 ? sum / years : 0
  const variance = years > 1 ? Math.max(0, (sum2 - years * mean * mean) / (years - 1)) : 0
  const aggregate = sortLosses(yearLosses)
  const occurrence = sortLosses(yearMaxEventLoss)
  return {
    years,
    averageAnnualLoss: mean,
    averageAnnualLossSe: years > 0 ? Math.sqrt(variance / years) : 0,
    lossYearShare: years > 0 ? lossYears / years : 0,
    aggregate: returnPeriodTable(aggregate, returnPeriods),
    occurrence: returnPeriodTable(occurrence, returnPeriods),
    aggregateCurve: curveOf(aggregate),
    occurrenceCurve: curveOf(occurrence),
  }
}

export interface YearLossTable { yearLosses: Float64Array; yearMaxEventLoss: Float64Array }

/**
 * Portfolio year-loss table: the same year index is the same simulated year at every site, so
 * aggregate losses add and the largest event of the year is the largest over sites.
 */
export function combineYearLossTables(tables: readonly YearLossTable[]): YearLossTable {
  const years = tables[0]?.yearLosses.length ?? 0
  const yearLosses = new Float64Array(years)
  const yearMaxEventLoss = new Float64Array(years)
  for (const table of tables) {
    if (table.yearLosses.length !== years) throw new RangeError('year-loss tables of a portfolio must cover the same number of years')
    for (let y = 0; y < years; y++) {
      yearLosses[y]! += table.yearLosses[y]!
      if (table.yearMaxEventLoss[y]! > yearMaxEventLoss[y]!) yearMaxEventLoss[y] = table.yearMaxEventLoss[y]!
    }
  }
  return { yearLosses, yearMaxEventLoss }
}
