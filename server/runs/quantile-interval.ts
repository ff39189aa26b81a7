// A distribution-free 95 % interval for the loss at a return period, from order statistics: the
// number of simulated years whose loss exceeds the true T-year loss is Binomial(Y, 1/T), so the
// ranks k ∓ 1.96·√(k(1 − k/Y)) around k = Y/T bracket it (normal approximation to the binomial;
// e.g. Hahn & Meeker, Statistical Intervals, 1991, ch. 5).
import { Z95 } from '../../shared/engine/statistics'

export function returnPeriodLossInterval(sortedDesc: Float64Array, returnPeriodYears: number): { lo: number, hi: number } | null {
  const years = sortedDesc.length
  const k = years / returnPeriodYears
  if (k < 1) return null
  const half = Z95 * Math.sqrt(k * (1 - k / years))
  const rank = (r: number) => sortedDesc[Math.min(years - 1, Math.max(0, Math.round(r) - 1))]!
  // More exceeding years → a lower loss: the upper rank gives the lower bound.
  return { lo: rank(k + half), hi: rank(Math.max(1, k - half)) }
}
