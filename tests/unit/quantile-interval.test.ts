import { describe, expect, it } from 'vitest'
import { returnPeriodLossInterval } from '../../server/runs/quantile-interval'

describe('return-period loss interval from order statistics', () => {
  it('brackets the k-th largest loss with ranks k ∓ 1.96·√(k(1 − k/Y))', () => {
    // 1000 years with losses 1000, 999, …, 1 (largest first). T = 10 → k = 100;
    // half-width 1.96·√(100·0.9) = 18.59 → ranks 81 and 119 (Hahn & Meeker 1991, order-statistic intervals).
    const sorted = Float64Array.from({ length: 1000 }, (_, i) => 1000 - i)
    const interval = returnPeriodLossInterval(sorted, 10)!
    expect(interval.hi).toBe(1000 - 81 + 1)
    expect(interval.lo).toBe(1000 - 119 + 1)
  })

  it('says nothing when the table is shorter than the return period', () => {
    expect(returnPeriodLossInterval(new Float64Array(50), 100)).toBeNull()
  })
})
