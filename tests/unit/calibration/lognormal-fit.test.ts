import { describe, expect, it } from 'vitest'
import jStat from 'jstat'
import { CalibrationInputError, fitTruncatedLognormal } from '../../../shared/calibration'
import { rng, truncatedLognormalSample } from './synthetic'

// CIGRE first negative strokes: median 31.1 kA, β 0.484 (Anderson & Eriksson 1980; MODEL.md §1).
const TRUE_MEDIAN = 31.1
const TRUE_BETA = 0.484
const MU = Math.log(TRUE_MEDIAN)

/** The truncated log-likelihood written with jstat's own log-normal pdf and cdf. */
function jstatLogLikelihood(x: readonly number[], threshold: number, mu: number, sigma: number): number {
  const tail = threshold > 0 ? 1 - jStat.lognormal.cdf(threshold, mu, sigma) : 1
  return x.reduce((t, xi) => t + Math.log(jStat.lognormal.pdf(xi, mu, sigma)), 0) - x.length * Math.log(tail)
}

describe('truncated log-normal fit of peak currents', () => {
  const sample = truncatedLognormalSample(rng('one-sample'), 800, MU, TRUE_BETA, 20)
  const fit = fitTruncatedLognormal(sample, 20)

  it('reports the maximum of the likelihood written with jstat: same value, gradient ≈ 0, curvature as reported', () => {
    const ll = jstatLogLikelihood(sample, 20, fit.mu, fit.sigma)
    expect(fit.logLikelihood).toBeCloseTo(ll, 4)
    // Central differences of jstat's likelihood (step 1e-5) vanish at the optimum.
    const h = 1e-5
    const gMu = (jstatLogLikelihood(sample, 20, fit.mu + h, fit.sigma) - jstatLogLikelihood(sample, 20, fit.mu - h, fit.sigma)) / (2 * h)
    const gSigma = (jstatLogLikelihood(sample, 20, fit.mu, fit.sigma + h) - jstatLogLikelihood(sample, 20, fit.mu, fit.sigma - h)) / (2 * h)
    expect(Math.abs(gMu)).toBeLessThan(1e-2)
    expect(Math.abs(gSigma)).toBeLessThan(1e-2)
    // Any move away lowers it.
    for (const [dm, ds] of [[0.01, 0], [-0.01, 0], [0, 0.01], [0, -0.01]]) {
      expect(jstatLogLikelihood(sample, 20, fit.mu + dm!, fit.sigma + ds!)).toBeLessThan(ll)
    }
    // The reported variance of μ is the inverse of the observed information from jstat's second
    // differences (2 × 2 inverse by hand; step 1e-3).
    const k = 1e-3
    const f = (m: number, s: number) => jstatLogLikelihood(sample, 20, m, s)
    const hmm = (f(fit.mu + k, fit.sigma) - 2 * ll + f(fit.mu - k, fit.sigma)) / k ** 2
    const hss = (f(fit.mu, fit.sigma + k) - 2 * ll + f(fit.mu, fit.sigma - k)) / k ** 2
    const hms = (f(fit.mu + k, fit.sigma + k) - f(fit.mu + k, fit.sigma - k) - f(fit.mu - k, fit.sigma + k) + f(fit.mu - k, fit.sigma - k)) / (4 * k * k)
    const det = hmm * hss - hms * hms
    expect(fit.covariance[0]).toBeCloseTo(-hss / det, 5)
    expect(fit.covariance[2]).toBeCloseTo(-hmm / det, 5)
  })

  it('agrees with the closed form when nothing is truncated', () => {
    // Untruncated log-normal MLE: μ = mean of ln x, σ² = mean squared deviation (textbook result).
    const plain = truncatedLognormalSample(rng('plain'), 200, MU, TRUE_BETA, 0)
    const f = fitTruncatedLognormal(plain, 0)
    const logs = plain.map(Math.log)
    const m = logs.reduce((a, b) => a + b, 0) / logs.length
    const s = Math.sqrt(logs.reduce((a, b) => a + (b - m) ** 2, 0) / logs.length)
    expect(f.mu).toBeCloseTo(m, 8)
    expect(f.sigma).toBeCloseTo(s, 8)
  })

  it('recovers the median and β within their intervals in about 95 % of repeated samples, where ignoring the threshold would not', () => {
    const trials = 200
    let medianCovered = 0
    let betaCovered = 0
    let naiveMedianCovered = 0
    for (let seed = 0; seed < trials; seed++) {
      const x = truncatedLognormalSample(rng(`coverage-${seed}`), 300, MU, TRUE_BETA, 20)
      const f = fitTruncatedLognormal(x, 20)
      if (f.medianInterval.lo <= TRUE_MEDIAN && TRUE_MEDIAN <= f.medianInterval.hi) medianCovered++
      if (f.betaInterval.lo <= TRUE_BETA && TRUE_BETA <= f.betaInterval.hi) betaCovered++
      const naive = fitTruncatedLognormal(x, 0)
      if (naive.medianInterval.lo <= TRUE_MEDIAN && TRUE_MEDIAN <= naive.medianInterval.hi) naiveMedianCovered++
    }
    // Nominal 95 % less a Monte Carlo allowance of ~2.5 binomial SE (√(0.95·0.05/200) = 1.5 %); common practice.
    expect(medianCovered / trials).toBeGreaterThanOrEqual(0.91)
    expect(medianCovered / trials).toBeLessThanOrEqual(0.99)
    expect(betaCovered / trials).toBeGreaterThanOrEqual(0.91)
    expect(betaCovered / trials).toBeLessThanOrEqual(0.99)
    // With a 20 kA threshold 18 % of strokes go unrecorded; a fit that ignores it overstates the median.
    expect(naiveMedianCovered / trials).toBeLessThan(0.5)
  })

  it('says why it cannot fit', () => {
    expect(() => fitTruncatedLognormal([30, 40, 50], 2)).toThrow(CalibrationInputError)
    expect(() => fitTruncatedLognormal([30, 40, 50], 2)).toThrow(/at least 10/)
    expect(() => fitTruncatedLognormal([3, 30, 40, 50, 60, 70, 80, 90, 100, 110, 120], 10)).toThrow(/below the detection threshold/)
  })
})
