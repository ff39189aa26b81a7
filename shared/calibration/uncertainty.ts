// The uncertainty a calibration's estimate carries, as assumption uncertainties (issue "How sure are we"):
//  - flash density from a Poisson count: a log-normal factor on Ng whose 2.5 / 97.5 % points are the
//    exact Poisson (Garwood 1936) interval of the count divided by the count;
//  - U50 and σ of an impulse series from the maximum-likelihood covariance (the inverse of the observed
//    Fisher information; e.g. Casella & Berger, Statistical Inference, 2nd ed., §10.1), carried to
//    (ln U50, σ) by the delta method: log-normal on U50, normal (truncated to σ's valid range) on σ,
//    and their correlation;
//  - the current law's median and β from the truncated log-normal fit's covariance of (μ, σ), the same way.
import { garwoodInterval } from '../engine/statistics'
import { normalQuantile } from '../engine/normal'
import type { UncertainDistribution } from '../engine/uncertainty-types'
import type { LognormalFit } from './lognormal-fit'
import type { ProbitFit } from './probit'
import type { Sym2 } from './matrix2'

/** Correlations must lie strictly inside (−1, 1) for a Gaussian copula. */
const RHO_LIMIT = 0.999

const clampRho = (rho: number) => Math.max(-RHO_LIMIT, Math.min(RHO_LIMIT, rho))

/** The set's schema caps σ of ln(value) at 3; a fit that uncertain is capped there (its interval says more). */
const lnSd = (variance: number) => Math.min(3, Math.sqrt(variance))

function correlation([c00, c01, c11]: Sym2): number {
  return c00 > 0 && c11 > 0 ? clampRho(c01 / Math.sqrt(c00 * c11)) : 0
}

export interface FlashCountUncertainty {
  /** Ng-factor distribution (median near 1). */
  distribution: Extract<UncertainDistribution, { kind: 'lognormal' }>
  /** The Garwood interval of the factor at `confidence` that the log-normal reproduces. */
  interval: { lo: number, hi: number }
  confidence: number
}

/**
 * The counting uncertainty of a flash density estimated from `count` flashes, as a factor on Ng.
 * The Garwood interval [L, U] of a Poisson mean given the count becomes [L/n, U/n] for the factor;
 * the log-normal with median √(L·U)/n and σ = ln(U/L) / (2 z) has exactly those points as its
 * (1 ∓ confidence)/2 quantiles. Null for a count of 0 (no estimate to be uncertain about).
 */
export function flashCountUncertainty(count: number, confidence = 0.95): FlashCountUncertainty | null {
  if (!(count > 0) || !Number.isInteger(count)) return null
  const { lo, hi } = garwoodInterval(count, confidence)
  const z = normalQuantile(0.5 + confidence / 2)
  return {
    distribution: { kind: 'lognormal', median: Math.sqrt(lo * hi) / count, sigmaLn: Math.log(hi / lo) / (2 * z) },
    interval: { lo: lo / count, hi: hi / count },
    confidence,
  }
}

export interface PairUncertainty {
  /** Covariance of the two estimates in the parametrisation the distributions use. */
  covariance: Sym2
  first: UncertainDistribution
  second: UncertainDistribution
  rho: number
}

/**
 * Covariance of (ln U50, σ) from the probit fit's covariance of (α, β) (P = Φ(α + β ln U)), by the
 * delta method: ln U50 = −α/β and σ = 1/β, so J = [[−1/β, α/β²], [0, −1/β²]] and C' = J C Jᵀ.
 */
export function probitCovarianceLogU50Sigma(fit: Pick<ProbitFit, 'alpha' | 'beta' | 'covariance'>): Sym2 {
  const { alpha: a, beta: b } = fit
  const [c00, c01, c11] = fit.covariance
  const j00 = -1 / b, j01 = a / (b * b), j11 = -1 / (b * b)
  const v00 = j00 * j00 * c00 + 2 * j00 * j01 * c01 + j01 * j01 * c11
  const v01 = j00 * j11 * c01 + j01 * j11 * c11
  const v11 = j11 * j11 * c11
  return [v00, v01, v11]
}

/**
 * U50 (log-normal, in kV after the equivalence factor `k`) and σ (normal, truncated to σ's valid
 * range by the assumption set) of an impulse series' maximum-likelihood fit. The central values
 * are the ones written into the assumption set (`u50Kv`, `sigma`, rounded as the set stores them).
 */
export function thresholdUncertainty(fit: Pick<ProbitFit, 'alpha' | 'beta' | 'covariance'>, u50Kv: number, sigma: number): PairUncertainty {
  const covariance = probitCovarianceLogU50Sigma(fit)
  return {
    covariance,
    first: { kind: 'lognormal', median: u50Kv, sigmaLn: lnSd(covariance[0]) },
    second: { kind: 'normal', mean: sigma, sd: Math.sqrt(covariance[2]) },
    rho: correlation(covariance),
  }
}

/**
 * The log-normal current law's median (log-normal: σ of ln median = se of μ) and β = σ (normal,
 * truncated to β > 0) from the fit's covariance of (μ, σ).
 */
export function currentLawUncertainty(fit: Pick<LognormalFit, 'covariance'>, medianKa: number, beta: number): PairUncertainty {
  const covariance = fit.covariance
  return {
    covariance,
    first: { kind: 'lognormal', median: medianKa, sigmaLn: lnSd(covariance[0]) },
    second: { kind: 'normal', mean: beta, sd: Math.sqrt(covariance[2]) },
    rho: correlation(covariance),
  }
}
