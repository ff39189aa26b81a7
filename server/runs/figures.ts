// Combining per-site counts into portfolio figures (pure). Frequency-mode sums use the engine's
// sumEstimates.
import { countEstimate } from '../../shared/engine/statistics'
import { figureFromCount } from '../../shared/results/figure'
import type { Figure } from './compute'

/**
 * Year mode: counts over the same simulated years add; exact Poisson (Garwood) interval on the sum.
 * Parts carry their stored whole count (rows written before counts were stored were backfilled
 * from rate × years by the migration).
 */
export function sumCounts(parts: readonly Figure[], years: number): Figure {
  let count = 0
  for (const p of parts) count += p.count ?? Math.round(p.rate * years)
  return figureFromCount(countEstimate(count, years), years)
}
