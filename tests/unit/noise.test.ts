// Change against simulation noise: z = (b − a) / SE, within noise when |z| ≤ 1.96 (two-sided 95 %
// normal quantile, Abramowitz & Stegun 26.2). Cases hand-worked.
import { describe, expect, it } from 'vitest'
import { changeVersusNoise, describeNoise, planChangeVersusNoise } from '../../shared/results/noise'

describe('changeVersusNoise', () => {
  it('combines independent standard errors in quadrature', () => {
    const n = changeVersusNoise({ value: 10, se: 3 }, { value: 15, se: 4 })
    expect(n.se).toBe(5) // hand-worked: √(3² + 4²)
    expect(n.z).toBe(1) // hand-worked: 5 / 5
    expect(n.verdict).toBe('within_noise')
    expect(describeNoise(n)).toBe('within noise (z = 1.0)')
  })
  it('marks a change beyond 1.96 standard errors', () => {
    const n = changeVersusNoise({ value: 10, se: 0.6 }, { value: 8, se: 0.8 })
    expect(n.z).toBeCloseTo(-2, 12) // hand-worked: −2 / 1
    expect(n.verdict).toBe('exceeds_noise')
    expect(describeNoise(n)).toBe('exceeds noise (z = −2.0)')
  })
  it('uses the paired standard error when given', () => {
    const n = changeVersusNoise({ value: 10, se: 3 }, { value: 11, se: 3 }, { pairedSe: 0.25 })
    expect(n.z).toBe(4) // hand-worked: 1 / 0.25
    expect(n.basis).toBe('paired')
    expect(n.verdict).toBe('exceeds_noise')
  })
  it('says identical for same inputs and seed, and not comparable without an estimate', () => {
    expect(changeVersusNoise({ value: 2, se: 1 }, { value: 2, se: 1 }, { sameInputsAndSeed: true }).verdict).toBe('identical') // bit-reproducible engine
    expect(changeVersusNoise(null, { value: 2, se: 1 }).verdict).toBe('not_comparable') // site in one run only
  })
  it('plans: shared actions cancel, the others add their paired errors', () => {
    const n = planChangeVersusNoise([{ rate: 3, se: 0.3 }], [{ rate: 5, se: 0.4 }])
    expect(n.difference).toBe(2) // hand-worked: 5 − 3
    expect(n.se).toBeCloseTo(0.5, 12) // hand-worked: √(0.3² + 0.4²)
    expect(n.verdict).toBe('exceeds_noise') // hand-worked: z = 4
  })
})
