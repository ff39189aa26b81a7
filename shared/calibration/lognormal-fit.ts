// Log-normal fit of first-stroke peak currents by maximum likelihood, with the network's detection
// threshold as left truncation (MODEL.md §7).
//
// A network records a stroke only when its estimated peak current reaches a threshold T, so the
// recorded currents x ≥ T follow the log-normal conditioned on X ≥ T. With y = ln x, a = (ln T − μ)/σ
// and z = (y − μ)/σ, the log-likelihood of n records is
//   ℓ(μ, σ) = Σ [ ln φ(zᵢ) − ln σ − yᵢ ] − n · ln(1 − Φ(a)).
// Ignoring the truncation overstates the median and understates β, because the small strokes that
// were missed are exactly the ones that pull the median down.
import { normalCdf, normalQuantile } from '../engine/normal'
import { CalibrationInputError } from './errors'
import { invertSym2, isNegativeDefinite, solveSym2, type Sym2 } from './matrix2'

const LN_SQRT_2PI = 0.5 * Math.log(2 * Math.PI)

export const MINIMUM_CURRENTS_FOR_FIT = 10

export interface LognormalFit {
  n: number
  thresholdKa: number
  /** Location and scale of ln I: the median is e^μ kA, β = σ. */
  mu: number
  sigma: number
  medianKa: number
  beta: number
  confidence: number
  medianInterval: { lo: number, hi: number }
  betaInterval: { lo: number, hi: number }
  /** Covariance of (μ, σ) from the observed information at the optimum. */
  covariance: Sym2
  logLikelihood: number
  /** Gradient of ℓ at the reported optimum (≈ 0). */
  gradient: [number, number]
  iterations: number
  /** Share of the fitted law below the threshold, i.e. strokes the network is expected to miss. */
  shareBelowThreshold: number
  method: string
}

interface Sums { n: number, s1: number, s2: number, sumY: number }

function sums(logs: readonly number[], mu: number, sigma: number): Sums {
  let s1 = 0, s2 = 0, sumY = 0
  for (const y of logs) { const z = (y - mu) / sigma; s1 += z; s2 += z * z; sumY += y }
  return { n: logs.length, s1, s2, sumY }
}

/** Upper tail Q(a) = 1 − Φ(a) and the inverse Mills ratio λ(a) = φ(a)/Q(a), with its derivative λ' = λ(λ − a). */
function tail(a: number): { logQ: number, lambda: number, dLambda: number } {
  if (a === -Infinity) return { logQ: 0, lambda: 0, dLambda: 0 }
  const q = normalCdf(-a)
  const phi = Math.exp(-0.5 * a * a - LN_SQRT_2PI)
  // Far in the upper tail Q underflows; λ(a) ≈ a + 1/a there (Mills ratio asymptote).
  const lambda = q > 1e-300 ? phi / q : a + 1 / a
  return { logQ: q > 1e-300 ? Math.log(q) : -0.5 * a * a - LN_SQRT_2PI - Math.log(a), lambda, dLambda: lambda * (lambda - a) }
}

function truncationPoint(thresholdKa: number, mu: number, sigma: number): number {
  return thresholdKa > 0 ? (Math.log(thresholdKa) - mu) / sigma : -Infinity
}

/** ℓ(μ, σ) for currents (kA) all at or above the threshold (0 = no truncation). */
export function truncatedLognormalLogLikelihood(currentsKa: readonly number[], thresholdKa: number, mu: number, sigma: number): number {
  const logs = currentsKa.map(Math.log)
  return logLikelihoodOfLogs(logs, thresholdKa, mu, sigma)
}

function logLikelihoodOfLogs(logs: readonly number[], thresholdKa: number, mu: number, sigma: number): number {
  if (!(sigma > 0)) return -Infinity
  const { n, s2, sumY } = sums(logs, mu, sigma)
  const { logQ } = tail(truncationPoint(thresholdKa, mu, sigma))
  return -0.5 * s2 - n * (Math.log(sigma) + LN_SQRT_2PI) - sumY - n * logQ
}

/** Analytic gradient and Hessian of ℓ in (μ, σ). */
function derivatives(logs: readonly number[], thresholdKa: number, mu: number, sigma: number): { g: [number, number], h: Sym2 } {
  const { n, s1, s2 } = sums(logs, mu, sigma)
  const a = truncationPoint(thresholdKa, mu, sigma)
  const { lambda, dLambda } = tail(a)
  const aa = Number.isFinite(a) ? a : 0
  const s = sigma * sigma
  return {
    g: [(s1 - n * lambda) / sigma, (s2 - n - n * lambda * aa) / sigma],
    h: [
      -n * (1 - dLambda) / s,
      (-2 * s1 + n * dLambda * aa + n * lambda) / s,
      (-3 * s2 + n + 2 * n * lambda * aa + n * aa * aa * dLambda) / s,
    ],
  }
}

/**
 * Maximum-likelihood fit by Newton–Raphson with step halving (gradient ascent where the Hessian is
 * not negative definite), started from the untruncated sample moments. Intervals: Wald intervals
 * from the observed information, for μ (then exponentiated: median) and for ln σ (then
 * exponentiated: β), so both stay positive.
 */
export function fitTruncatedLognormal(currentsKa: readonly number[], thresholdKa = 0, confidence = 0.95): LognormalFit {
  if (!(thresholdKa >= 0) || !Number.isFinite(thresholdKa)) throw new CalibrationInputError('The detection threshold must be a current ≥ 0 kA.')
  const bad = currentsKa.filter(x => !(x > 0) || !Number.isFinite(x))
  if (bad.length) throw new CalibrationInputError(`Peak currents must be magnitudes above 0 kA; ${bad.length} are not.`)
  const below = currentsKa.filter(x => x < thresholdKa).length
  if (below) throw new CalibrationInputError(`${below} currents lie below the detection threshold of ${thresholdKa} kA; leave them out or lower the threshold.`)
  if (currentsKa.length < MINIMUM_CURRENTS_FOR_FIT) {
    throw new CalibrationInputError(`A current fit needs at least ${MINIMUM_CURRENTS_FOR_FIT} negative first strokes at or above the threshold; there are ${currentsKa.length}. Widen the radius or add records.`)
  }
  const logs = currentsKa.map(Math.log)
  const n = logs.length
  let mu = logs.reduce((t, y) => t + y, 0) / n
  let sigma = Math.sqrt(logs.reduce((t, y) => t + (y - mu) ** 2, 0) / n)
  if (!(sigma > 0)) throw new CalibrationInputError('All currents are equal; a spread cannot be fitted.')

  let ll = logLikelihoodOfLogs(logs, thresholdKa, mu, sigma)
  let iterations = 0
  let converged = false
  for (; iterations < 500; iterations++) {
    const { g, h } = derivatives(logs, thresholdKa, mu, sigma)
    // Converged when the Newton decrement (or, failing that, the scaled gradient) is negligible.
    let step = isNegativeDefinite(h) ? solveSym2([-h[0], -h[1], -h[2]], g) : null
    if (!step) step = [g[0] * sigma * sigma / n, g[1] * sigma * sigma / n]
    const decrement = step[0] * g[0] + step[1] * g[1]
    if (Math.abs(decrement) < 1e-12 * n) { converged = true; break }
    let t = 1
    let accepted = false
    for (let k = 0; k < 60; k++, t /= 2) {
      const m2 = mu + t * step[0]
      const s2 = sigma + t * step[1]
      if (!(s2 > 0)) continue
      const l2 = logLikelihoodOfLogs(logs, thresholdKa, m2, s2)
      if (l2 >= ll - 1e-12 * Math.abs(ll)) { mu = m2; sigma = s2; ll = l2; accepted = true; break }
    }
    if (!accepted) { converged = true; break }
  }
  const { g, h } = derivatives(logs, thresholdKa, mu, sigma)
  const covariance = isNegativeDefinite(h) ? invertSym2([-h[0], -h[1], -h[2]]) : null
  if (!converged || !covariance || !(sigma > 0) || !Number.isFinite(mu)) {
    throw new CalibrationInputError('The current fit did not settle: the threshold may cut away most of the distribution, or there are too few records. Lower the threshold or widen the radius.')
  }
  const z = normalQuantile(0.5 + confidence / 2)
  const seMu = Math.sqrt(covariance[0])
  const seLogSigma = Math.sqrt(covariance[2]) / sigma
  const a = truncationPoint(thresholdKa, mu, sigma)
  return {
    n, thresholdKa, mu, sigma, medianKa: Math.exp(mu), beta: sigma, confidence,
    medianInterval: { lo: Math.exp(mu - z * seMu), hi: Math.exp(mu + z * seMu) },
    betaInterval: { lo: sigma * Math.exp(-z * seLogSigma), hi: sigma * Math.exp(z * seLogSigma) },
    covariance, logLikelihood: ll, gradient: g, iterations,
    shareBelowThreshold: Number.isFinite(a) ? normalCdf(a) : 0,
    method: thresholdKa > 0
      ? `maximum likelihood, log-normal truncated below at ${thresholdKa} kA; Wald intervals from the observed information`
      : 'maximum likelihood, log-normal; Wald intervals from the observed information',
  }
}
