// The uncertainty form's drafts (assumptions pages): texts ↔ distributions, the basis of an untouched
// or edited range, words with units, and the comparison of two versions.
import { describe, expect, it } from 'vitest'
import {
  changeKind, compareUncertainty, describeDistribution, distributionOf, draftOf, entryOf, ninetyPercentRange, stableJson, startingDistribution, uncertaintyOf,
} from '../../shared/assumptions/uncertainty-form'
import { defaultAssumptions, distributionQuantile, uncertainPathRange, type UncertainAssumption } from '../../shared/engine/index'

const sigma: UncertainAssumption = { path: 'thresholds.sharp_device.sigma', distribution: { kind: 'triangular', min: 0.1, mode: 0.3, max: 0.6 }, basis: 'illustrative', note: 'why' }

describe('drafts', () => {
  it('an untouched range keeps its basis even when its keys come back in another order (jsonb sorts them)', () => {
    const fromDatabase = { ...sigma, distribution: { max: 0.6, min: 0.1, kind: 'triangular', mode: 0.3 } } as unknown as UncertainAssumption
    expect(entryOf(draftOf(fromDatabase))).toEqual(sigma)
  })
  it('an edited distribution becomes the analyst\'s; an edited note alone does not change the basis', () => {
    const d = draftOf(sigma)
    expect(entryOf({ ...d, note: 'new words' }).basis).toBe('illustrative')
    expect(entryOf({ ...d, values: { ...d.values, max: '0.7' } })).toEqual({ ...sigma, distribution: { ...sigma.distribution, max: 0.7 }, basis: 'analyst' })
  })
  it('numbers survive the round trip through text exactly; empty optional bounds are left out; a missing number is NaN for validation to name', () => {
    const e: UncertainAssumption = { path: 'lognormalBeta', distribution: { kind: 'normal', mean: 0.4837261234, sd: 0.0312345678 }, basis: 'calibration', note: '' }
    expect(entryOf(draftOf(e))).toEqual(e)
    expect(Number.isNaN((distributionOf({ kind: 'uniform', values: { min: '', max: '1' } }) as { min: number }).min)).toBe(true)
    const u = uncertaintyOf([draftOf(e)], [{ a: 'x', b: 'y', rho: '-0.25' }])
    expect(u.correlations).toEqual([{ a: 'x', b: 'y', rho: -0.25 }])
  })
  it('stableJson ignores key order only', () => {
    expect(stableJson({ b: 1, a: { d: 2, c: 3 } })).toBe(stableJson({ a: { c: 3, d: 2 }, b: 1 }))
    expect(stableJson({ a: 1 })).not.toBe(stableJson({ a: 2 }))
  })
})

describe('starting and changing distributions', () => {
  it('a positive value without an upper end starts log-normal on it; a bounded one a normal on it', () => {
    expect(startingDistribution(31, uncertainPathRange(defaultAssumptions, 'powerLawMedianKa')!)).toEqual({ kind: 'lognormal', median: 31, sigmaLn: 0.2 })
    expect(startingDistribution(0.65, uncertainPathRange(defaultAssumptions, 'strikingDistanceB')!)).toEqual({ kind: 'normal', mean: 0.65, sd: 0.065 })
  })
  it('a change of kind keeps the 5–95 % range of a uniform (closed form: U(a, b) has 5 % at a + 0.05(b − a))', () => {
    const t = changeKind({ kind: 'uniform', min: 0, max: 1 }, 'triangular', undefined)
    expect(t).toEqual({ kind: 'triangular', min: 0.05, mode: 0.5, max: 0.95 })
    const n = changeKind({ kind: 'uniform', min: 0, max: 1 }, 'normal', undefined) as { mean: number, sd: number }
    expect(distributionQuantile({ kind: 'normal', mean: n.mean, sd: n.sd }, 0.95)).toBeCloseTo(0.95, 2)
  })
})

describe('words', () => {
  it('say the distribution with its units and the central 90 %', () => {
    expect(describeDistribution({ kind: 'lognormal', median: 70, sigmaLn: 0.35 }, 'kV')).toBe('log-normal, median 70 kV, σ of ln(value) 0.35')
    expect(ninetyPercentRange({ kind: 'lognormal', median: 70, sigmaLn: 0.35 }, 'kV')).toBe('39.4 to 124 kV') // 70·exp(∓1.645·0.35)
    expect(describeDistribution({ kind: 'triangular', min: 0.8e8, mode: 1.2e8, max: 2e8 }, 'm/s')).toBe('triangular, 8.00 × 10⁷ to 2.00 × 10⁸ m/s, mode 1.20 × 10⁸ m/s')
    expect(describeDistribution({ kind: 'normal', mean: 0.3, sd: 0.05 }, 'dimensionless')).toBe('normal, mean 0.3, standard deviation 0.05, truncated to the valid range')
  })
  it('the comparison pairs entries by path and marks the differences', () => {
    const a = { entries: [sigma], correlations: [] }
    const b = { entries: [{ ...sigma, distribution: { max: 0.6, mode: 0.3, min: 0.1, kind: 'triangular' } } as unknown as UncertainAssumption, { ...sigma, path: 'lognormalBeta' }], correlations: [] }
    const rows = compareUncertainty(a, b, ['lognormalBeta', 'thresholds.sharp_device.sigma'])
    expect(rows.map(r => [r.path, r.differs])).toEqual([['lognormalBeta', true], ['thresholds.sharp_device.sigma', false]])
    expect(rows[0]!.a).toBeUndefined()
  })
})
