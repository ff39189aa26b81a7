// Engine functions against published values. Each expected value names its source beside it.
import { describe, expect, it } from 'vitest'
import jStat from 'jstat'
import {
  collectionAreaCylinder, collectionAreaRectangular, countEstimate, flashDensityFromThunderstormDays, garwoodInterval,
  indirectFlashMinimumDistance, inducedPotentialKv, isolatedTankQuadrature, lognormalLaw, normalCdf, normalQuantile,
  parseAssumptions, powerLaw, ruskCoupling, ruskVelocityFactor, strikingDistance, truncate, RUSK_Z0_OHM,
} from '../../shared/engine/index'
import { makeTank } from '../unit/engine/fixtures'

describe('induced potential (Rusk)', () => {
  it('velocity factor and coupling at β = 0.4', () => {
    expect(ruskVelocityFactor(0.4)).toBeCloseTo(1.29488, 5) // IEEE Std 1410 simplified form: 1 + β/(√2·sqrt(1 − β²/2)) = 1.29488
    expect(RUSK_Z0_OHM * ruskVelocityFactor(0.4)).toBeCloseTo(38.85, 2) // IEEE Std 1410: Z0·factor = 38.85 Ω ("38.8")
  })
  it('the default return-stroke velocity gives the 38.8 Ω of the simplified form', () => {
    expect(ruskCoupling(1.2e8)).toBeCloseTo(38.85, 1) // IEEE Std 1410: v = 1.2·10⁸ m/s ↔ 38.8 Ω
  })
  it('simplified Rusk: 10 kA, h = 10 m, y = 100 m', () => {
    expect(inducedPotentialKv(38.8, 10, 10, 100)).toBeCloseTo(38.8, 6) // IEEE Std 1410: V = 38.8·I·h/y = 38.8 kV
  })
})

describe('peak-current distributions', () => {
  const ae = powerLaw(31, 2.6)
  it('Anderson–Eriksson power law', () => {
    expect(ae.exceedance(31)).toBeCloseTo(0.5, 12) // IEEE Std 1410 / Anderson & Eriksson: median 31 kA
    expect(ae.exceedance(100)).toBeCloseTo(0.0454, 4) // IEEE Std 1410: P(I ≥ 100 kA) ≈ 4.5 %
    expect(ae.exceedance(10)).toBeCloseTo(0.9499, 4) // IEEE Std 1410: P(I ≥ 10 kA) ≈ 95 %
  })
  it('inversion sampling returns the law’s quantiles', () => {
    expect(ae.quantile(0.5)).toBeCloseTo(31, 9) // MODEL.md §1: i = 31·((1−u)/u)^(1/2.6), median 31 kA
  })
  it('CIGRE log-normal (31.1 kA, β = 0.484)', () => {
    const cigre = lognormalLaw(31.1, 0.484)
    expect(cigre.exceedance(100)).toBeCloseTo(0.0079, 4) // CIGRE (Anderson & Eriksson 1980) tabulated ≈ 0.8 %
    expect(cigre.exceedance(100)).toBeCloseTo(1 - jStat.lognormal.cdf(100, Math.log(31.1), 0.484), 6) // jstat log-normal
    expect(cigre.quantile(0.95)).toBeCloseTo(68.95, 2) // 31.1·exp(1.6449·0.484) = 68.95 kA
    expect(cigre.quantile(0.95)).toBeCloseTo(jStat.lognormal.inv(0.95, Math.log(31.1), 0.484), 5) // jstat log-normal
  })
  it('truncation renormalises', () => {
    const t = truncate(ae, 2, 400)
    const mass = ae.cdf(400) - ae.cdf(2)
    expect(t.exceedance(100)).toBeCloseTo((ae.exceedance(100) - ae.exceedance(400)) / mass, 12) // MODEL.md §1: truncated to [Imin, Imax], renormalised
  })
})

describe('normal distribution', () => {
  it('matches tabulated values', () => {
    expect(normalCdf(1.959963984540054)).toBeCloseTo(0.975, 7) // Abramowitz & Stegun Table 26.1
    expect(normalCdf(-3)).toBeCloseTo(0.0013498980316301, 9) // Abramowitz & Stegun Table 26.1
    expect(normalCdf(-6) / jStat.normal.cdf(-6, 0, 1)).toBeCloseTo(1, 6) // jstat normal; erfcc relative error < 1.2e-7 (Numerical Recipes §6.2)
    expect(normalQuantile(0.975)).toBeCloseTo(1.959963984540054, 8) // Abramowitz & Stegun Table 26.5
    expect(normalQuantile(1e-6)).toBeCloseTo(jStat.normal.inv(1e-6, 0, 1), 7) // jstat normal
  })
})

describe('striking distance and attachment', () => {
  const p = { strikingDistanceA: 10, strikingDistanceB: 0.65, groundStrikingFactor: 1 }
  it('rs = 10·I^0.65 near the IEC 62305-1 rolling-sphere radii 20/30/45/60 m', () => {
    expect(strikingDistance(3, 10, 0.65)).toBeCloseTo(20.4, 1) // IEC 62305-1 class I: 3 kA ↔ 20 m
    expect(strikingDistance(5, 10, 0.65)).toBeCloseTo(28.5, 1) // IEC 62305-1 class II: 5 kA ↔ 30 m
    expect(strikingDistance(10, 10, 0.65)).toBeCloseTo(44.7, 1) // IEC 62305-1 class III: 10 kA ↔ 45 m
    expect(strikingDistance(16, 10, 0.65)).toBeCloseTo(60.6, 1) // IEC 62305-1 class IV: 16 kA ↔ 60 m
  })
  it('IEEE Std 1410 indirect-flash band: I = 31 kA, h = 10 m, rg = 0.9·rc', () => {
    expect(indirectFlashMinimumDistance(31, 10, { ...p, groundStrikingFactor: 0.9 })).toBeCloseTo(56.81, 2) // IEEE Std 1410: ymin = sqrt(rs² − (rg − h)²) ≈ 56.81 m
  })
  it('IEC 62305-2 collection areas', () => {
    expect(collectionAreaRectangular(20, 10, 8)).toBeCloseTo(3449.6, 1) // IEC 62305-2: L·W + 2·3H·(L+W) + π(3H)² = 3449.6 m²
    expect(collectionAreaCylinder(0, 8)).toBeCloseTo(Math.PI * 24 * 24, 9) // IEC 62305-2 mast: π(3H)² = 1809.6 m²
    expect(collectionAreaCylinder(2, 10)).toBeCloseTo(3216.99, 2) // IEC 62305-2 rule for a cylinder: π(a + 3H)² = π·32² m²
  })
  it('collection-area attachment: direct strikes N_D = Ng·A_D·1e-6', () => {
    const a = parseAssumptions({ attachmentModel: 'collection_area' })
    const q = isolatedTankQuadrature(makeTank({ heightM: 10, diameterM: 4 }), 4, a)
    expect(q.directPerYear).toBeCloseTo(4 * Math.PI * 32 * 32 * 1e-6, 12) // IEC 62305-2: N_D = N_G·A_D·C_D·10⁻⁶ (C_D = 1, isolated)
  })
})

describe('flash density from thunderstorm days', () => {
  it('Anderson and IEC rules', () => {
    expect(flashDensityFromThunderstormDays(40, 'anderson')).toBeCloseTo(4.02, 2) // IEEE Std 1410 (Anderson): 0.04·40^1.25 = 4.02
    expect(flashDensityFromThunderstormDays(40, 'iec')).toBeCloseTo(4.0, 12) // IEC 62305-2: 0.1·Td
  })
})

describe('Garwood intervals', () => {
  it('exact Poisson 95 % intervals', () => {
    expect(garwoodInterval(0).lo).toBe(0) // Garwood (1936): lower limit 0 for no event
    expect(garwoodInterval(0).hi).toBeCloseTo(3.689, 3) // Garwood (1936) table: 0 events → 3.689
    expect(garwoodInterval(10).lo).toBeCloseTo(4.795, 3) // Garwood (1936) table: 10 events → 4.795
    expect(garwoodInterval(10).hi).toBeCloseTo(18.390, 3) // Garwood (1936) table: 10 events → 18.390
  })
  it('large counts (Wilson–Hilferty branch) agree with jstat’s gamma quantiles', () => {
    const { lo, hi } = garwoodInterval(5000)
    expect(lo / jStat.gamma.inv(0.025, 5000, 1)).toBeCloseTo(1, 6) // jstat gamma quantile (χ²/2)
    expect(hi / jStat.gamma.inv(0.975, 5001, 1)).toBeCloseTo(1, 6) // jstat gamma quantile (χ²/2)
  })
  it('rates over simulated years', () => {
    const c = countEstimate(10, 1000)
    expect(c.rate).toBe(0.01) // 10 events in 1000 years (common practice: count / years)
    expect(c.hi).toBeCloseTo(0.018390, 6) // Garwood (1936): 18.390 / 1000
  })
})
