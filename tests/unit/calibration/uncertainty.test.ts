// The uncertainty a calibration carries into the assumptions (issue "How sure are we"): the Poisson
// count of flashes (Garwood 1936), and the maximum-likelihood covariance of U50 and σ and of the
// current law's median and β (covariance = inverse of the observed Fisher information; Casella &
// Berger, Statistical Inference, 2nd ed., §10.1), checked against numerical Hessians and closed forms.
import { describe, expect, it } from 'vitest'
import jStat from 'jstat'
import {
  currentLawUncertainty, fitProbit, fitTruncatedLognormal, flashCountUncertainty, probitCovarianceLogU50Sigma, probitLogLikelihood,
  thresholdUncertainty, truncatedLognormalLogLikelihood, type ImpulseApplication,
} from '../../../shared/calibration'
import { distributionQuantile, parseAssumptions } from '../../../shared/engine/index'
import { normal, rng, truncatedLognormalSample } from './synthetic'

type Sym2 = [number, number, number]

/** −(Hessian)⁻¹ of f at (x, y) by central differences (steps hx, hy): the brute-force inverse observed information. */
function numericalCovariance(f: (x: number, y: number) => number, x: number, y: number, hx: number, hy: number): Sym2 {
  const fxx = (f(x + hx, y) - 2 * f(x, y) + f(x - hx, y)) / (hx * hx)
  const fyy = (f(x, y + hy) - 2 * f(x, y) + f(x, y - hy)) / (hy * hy)
  const fxy = (f(x + hx, y + hy) - f(x + hx, y - hy) - f(x - hx, y + hy) + f(x - hx, y - hy)) / (4 * hx * hy)
  const [a, b, d] = [-fxx, -fxy, -fyy]
  const det = a * d - b * b
  return [d / det, -b / det, a / det]
}

function expectCloseRelative(actual: number, expected: number, tolerance: number) {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(tolerance * Math.abs(expected))
}

describe('flash density from a Poisson count: a log-normal factor on Ng with the Garwood interval', () => {
  // Exact Poisson 95 % limits for a count n: χ²(0.025; 2n)/2 and χ²(0.975; 2n + 2)/2 (Garwood 1936),
  // here from jstat's chi-square quantile (the code uses the gamma quantile), and tabulated values
  // from memory of the usual tables: n = 10 → 4.795–18.39, n = 100 → 81.36–121.6.
  const garwood = (n: number) => ({ lo: jStat.chisquare.inv(0.025, 2 * n) / 2, hi: jStat.chisquare.inv(0.975, 2 * n + 2) / 2 })
  for (const n of [1, 3, 10, 37, 100, 1000, 25_000]) {
    it(`${n} flash${n === 1 ? '' : 'es'}: the factor's 2.5 / 97.5 % points are the Garwood limits ÷ n (within 1e-6 relative)`, () => {
      const u = flashCountUncertainty(n)!
      const g = garwood(n)
      expectCloseRelative(distributionQuantile(u.distribution, 0.025), g.lo / n, 1e-6)
      expectCloseRelative(distributionQuantile(u.distribution, 0.975), g.hi / n, 1e-6)
      // And it validates as the reserved flash density factor of an assumption set.
      expect(() => parseAssumptions({ uncertainty: { entries: [{ path: 'flashDensityFactor', distribution: u.distribution, basis: 'calibration', note: 'test' }], correlations: [] } })).not.toThrow()
    })
  }
  it('matches the tabulated limits for 10 and 100 flashes (4 significant figures)', () => {
    const ten = flashCountUncertainty(10)!
    expectCloseRelative(ten.interval.lo * 10, 4.795, 2e-4)
    expectCloseRelative(ten.interval.hi * 10, 18.39, 2e-4)
    const hundred = flashCountUncertainty(100)!
    expectCloseRelative(hundred.interval.lo * 100, 81.36, 2e-4)
    expectCloseRelative(hundred.interval.hi * 100, 121.6, 5e-4)
  })
  it('narrows like 1/√n: σ of ln(factor) ≈ 1/√n for large counts (delta method on a Poisson mean)', () => {
    expectCloseRelative(flashCountUncertainty(10_000)!.distribution.sigmaLn, 1 / Math.sqrt(10_000), 0.01)
  })
  it('no count, no estimate', () => {
    expect(flashCountUncertainty(0)).toBeNull()
  })
})

function simulateSeries(seed: string, u50: number, sigma: number, levels: number[], perLevel: number): ImpulseApplication[] {
  const r = rng(seed)
  const out: ImpulseApplication[] = []
  for (const levelKv of levels) for (let k = 0; k < perLevel; k++) out.push({ levelKv, spark: levelKv >= u50 * Math.exp(sigma * normal(r)) })
  return out
}

describe('U50 and σ from the maximum-likelihood covariance', () => {
  const series = simulateSeries('uncertainty-probit', 90, 0.1, [70, 75, 80, 85, 90, 95, 100, 105, 110], 12)
  const fit = fitProbit(series)

  it('the delta-method covariance of (ln U50, σ) equals the inverse numerical Hessian of the log-likelihood in (ln U50, σ)', () => {
    const cov = probitCovarianceLogU50Sigma(fit)
    const brute = numericalCovariance((lnU, s) => probitLogLikelihood(series, Math.exp(lnU), s), Math.log(fit.u50Kv), fit.sigma, 1e-4, 1e-4)
    expectCloseRelative(cov[0], brute[0], 1e-3)
    expectCloseRelative(cov[1], brute[1], 1e-3)
    expectCloseRelative(cov[2], brute[2], 1e-3)
  })

  it('gives a log-normal on U50 and a normal on σ centred on the stored values, their correlation from the same matrix', () => {
    const u = thresholdUncertainty(fit, 90.12, 0.1003)
    const cov = probitCovarianceLogU50Sigma(fit)
    expect(u.first).toEqual({ kind: 'lognormal', median: 90.12, sigmaLn: Math.sqrt(cov[0]) })
    expect(u.second).toEqual({ kind: 'normal', mean: 0.1003, sd: Math.sqrt(cov[2]) })
    expect(u.rho).toBeCloseTo(cov[1] / Math.sqrt(cov[0] * cov[2]), 12)
    expect(Math.abs(u.rho)).toBeLessThan(1)
    // The fit's own Wald interval on ln U50 (z = 1.96) is the log-normal's 2.5–97.5 % range.
    const uc = thresholdUncertainty(fit, fit.u50Kv, fit.sigma)
    expectCloseRelative(distributionQuantile(uc.first, 0.025), fit.u50Interval.lo, 1e-6)
    expectCloseRelative(distributionQuantile(uc.first, 0.975), fit.u50Interval.hi, 1e-6)
  })
})

describe('the current law\'s median and β from the fit', () => {
  it('without a detection threshold: the closed form of the normal MLE, Var(μ̂) = σ̂²/n, Var(σ̂) = σ̂²/(2n), no correlation', () => {
    // Fisher information of a normal sample: diag(n/σ², 2n/σ²) (common practice; Casella & Berger §10.1).
    const sample = truncatedLognormalSample(rng('uncertainty-currents'), 400, Math.log(31.1), 0.484, 0)
    const fit = fitTruncatedLognormal(sample, 0)
    const u = currentLawUncertainty(fit, fit.medianKa, fit.beta)
    const n = sample.length
    expectCloseRelative((u.first as { sigmaLn: number }).sigmaLn, fit.sigma / Math.sqrt(n), 1e-6)
    expectCloseRelative((u.second as { sd: number }).sd, fit.sigma / Math.sqrt(2 * n), 1e-6)
    expect(Math.abs(u.rho)).toBeLessThan(1e-6)
  })
  it('with a detection threshold: the inverse numerical Hessian of the truncated likelihood, and a negative correlation', () => {
    const sample = truncatedLognormalSample(rng('uncertainty-currents-t'), 600, Math.log(31.1), 0.484, 20)
    const fit = fitTruncatedLognormal(sample, 20)
    const brute = numericalCovariance((mu, s) => truncatedLognormalLogLikelihood(sample, 20, mu, s), fit.mu, fit.sigma, 1e-4, 1e-4)
    const u = currentLawUncertainty(fit, fit.medianKa, fit.beta)
    expectCloseRelative((u.first as { sigmaLn: number }).sigmaLn, Math.sqrt(brute[0]), 1e-3)
    expectCloseRelative((u.second as { sd: number }).sd, Math.sqrt(brute[2]), 1e-3)
    expectCloseRelative(u.rho, brute[1] / Math.sqrt(brute[0] * brute[2]), 1e-3)
    // Truncation below: a lower median is traded for a wider spread (the missed small strokes), so ρ < 0.
    expect(u.rho).toBeLessThan(0)
  })
})
