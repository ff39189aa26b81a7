// Combining per-site figures into portfolio figures (pure).
import { countEstimate, Z95 } from '../../shared/engine/statistics'
import type { Figure } from './compute'

/** Sum of independent estimates: rates add, variances add, normal 95 % interval floored at 0. */
export function sumFigures(parts: readonly Figure[]): Figure {
  let rate = 0
  let variance = 0
  for (const p of parts) {
    rate += p.rate
    variance += p.se * p.se
  }
  const se = Math.sqrt(variance)
  return { rate, se, lo: Math.max(0, rate - Z95 * se), hi: rate + Z95 * se }
}

/** Year mode: counts over the same simulated years add; exact Poisson (Garwood) interval on the sum. */
export function sumCounts(parts: readonly Figure[], years: number): Figure {
  let count = 0
  for (const p of parts) count += Math.round(p.rate * years)
  const c = countEstimate(count, years)
  return { rate: c.rate, se: Math.sqrt(count) / years, lo: c.lo, hi: c.hi }
}
