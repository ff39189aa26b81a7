// "What drives it": the tanks or sites ranked by their contribution, with their share of the total.
import type { DriverInput } from './types'

export interface RankedDriver extends DriverInput {
  rank: number
  /** Share of the total (the sum of all items unless a total is given). */
  share: number
  /** Value relative to the largest item, for the bar length and colour. */
  relative: number
}

/** Items sorted by value, largest first (ties by label), cut to `limit`; shares of `total` or of the sum of all items. */
export function rankDrivers(items: readonly DriverInput[], limit = 10, total?: number): RankedDriver[] {
  const sum = total ?? items.reduce((s, d) => s + Math.max(0, d.value), 0)
  const sorted = [...items].sort((a, b) => b.value - a.value || a.label.localeCompare(b.label))
  const largest = Math.max(0, sorted[0]?.value ?? 0)
  return sorted.slice(0, limit).map((d, k) => ({
    ...d,
    rank: k + 1,
    share: sum > 0 ? Math.max(0, d.value) / sum : 0,
    relative: largest > 0 ? Math.max(0, d.value) / largest : 0,
  }))
}
