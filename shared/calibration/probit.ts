// 50 % sparking level and scatter by maximum likelihood on the log-normal (probit) model (MODEL.md §4, §7):
//   P(spark | U) = Φ((ln U − ln U50) / σ) = Φ(α + β·ln U),  β = 1/σ,  α = −ln U50 / σ.
// Fitted by Fisher scoring (iteratively reweighted least squares for the probit link; McCullagh &
// Nelder, Generalized Linear Models, 2nd ed., §4.4); intervals from the observed information at the
// optimum, by the delta method on ln U50 and on ln σ (so both stay positive).
import { normalCdf, normalQuantile } from '../engine/normal'
import { CalibrationInputError } from './errors'
import type { ImpulseApplication } from './impulse'
import { invertSym2, solveSym2, type Sym2 } from './matrix2'

const LN_SQRT_2PI = 0.5 * Math.log(2 * Math.PI)

export interface ProbitFit {
  u50Kv: number
  sigma: number
  confidence: number
  u50Interval: { lo: number, hi: number }
  sigmaInterval: { lo: number, hi: number }
  /** α, β of Φ(α + β ln U) and their covariance (observed information). */
  alpha: number
  beta: number
  covariance: Sym2
  logLikelihood: number
  gradient: [number, number]
  iterations: number
  applications: number
  sparks: number
  method: string
}

/** ln Φ(η) and ln(1 − Φ(η)), kept finite far in the tails. */
function logCdfs(eta: number): { logP: number, logQ: number, p: number, q: number } {
  const p = normalCdf(eta)
  const q = normalCdf(-eta)
  const tailLog = (x: number) => -0.5 * x * x - LN_SQRT_2PI - Math.log(-x) // ln Φ(x) for x ≪ 0 (Mills)
  return { p, q, logP: p > 1e-300 ? Math.log(p) : tailLog(eta), logQ: q > 1e-300 ? Math.log(q) : tailLog(-eta) }
}

export function probitLogLikelihood(series: readonly ImpulseApplication[], u50Kv: number, sigma: number): number {
  let ll = 0
  for (const a of series) {
    const { logP, logQ } = logCdfs((Math.log(a.levelKv) - Math.log(u50Kv)) / sigma)
    ll += a.spark ? logP : logQ
  }
  return ll
}

interface Pass { ll: number, g: [number, number], expected: Sym2, observed: Sym2 }

function pass(series: readonly ImpulseApplication[], alpha: number, beta: number): Pass {
  let ll = 0, g0 = 0, g1 = 0, e00 = 0, e01 = 0, e11 = 0, o00 = 0, o01 = 0, o11 = 0
  for (const a of series) {
    const x = Math.log(a.levelKv)
    const eta = alpha + beta * x
    const { p, q, logP, logQ } = logCdfs(eta)
    const phi = Math.exp(-0.5 * eta * eta - LN_SQRT_2PI)
    // Ratios φ/Φ and φ/(1−Φ); in the far tails their Mills-ratio limits.
    const r1 = p > 1e-300 ? phi / p : -eta
    const r0 = q > 1e-300 ? phi / q : eta
    const score = a.spark ? r1 : -r0
    // −d²ℓ/dη² for this application (observed) and its expectation φ²/(Φ(1−Φ)) (Fisher).
    const curvature = a.spark ? r1 * (r1 + eta) : r0 * (r0 - eta)
    const info = p > 0 && q > 0 ? phi * phi / (p * q) : 0
    ll += a.spark ? logP : logQ
    g0 += score; g1 += score * x
    e00 += info; e01 += info * x; e11 += info * x * x
    o00 += curvature; o01 += curvature * x; o11 += curvature * x * x
  }
  return { ll, g: [g0, g1], expected: [e00, e01, e11], observed: [o00, o01, o11] }
}

export function fitProbit(series: readonly ImpulseApplication[], confidence = 0.95): ProbitFit {
  if (series.length === 0) throw new CalibrationInputError('The series is empty: enter the applied levels and whether each one sparked.')
  const badLevel = series.findIndex(a => !(a.levelKv > 0) || !Number.isFinite(a.levelKv))
  if (badLevel >= 0) throw new CalibrationInputError(`Application ${badLevel + 1}: the level must be a voltage above 0 kV.`)
  const sparks = series.filter(a => a.spark)
  const quiet = series.filter(a => !a.spark)
  if (sparks.length === 0 || quiet.length === 0) {
    throw new CalibrationInputError(`Every application ${sparks.length ? 'sparked' : 'did not spark'}: maximum likelihood needs both outcomes.`)
  }
  const lowestSpark = Math.min(...sparks.map(a => a.levelKv))
  const highestQuiet = Math.max(...quiet.map(a => a.levelKv))
  if (!(highestQuiet > lowestSpark)) {
    throw new CalibrationInputError(`Sparks and no-sparks do not overlap (every level ≤ ${highestQuiet} kV held, every level ≥ ${lowestSpark} kV sparked), so the scatter σ cannot be estimated: the likelihood keeps rising as σ → 0. Add applications between those levels or use a smaller step.`)
  }

  // Start: U50 at the middle of the overlap, σ = 0.1.
  const start = (Math.log(lowestSpark) + Math.log(highestQuiet)) / 2
  let beta = 10
  let alpha = -start * beta
  let current = pass(series, alpha, beta)
  let iterations = 0
  let converged = false
  for (; iterations < 200; iterations++) {
    const step = solveSym2(current.expected, current.g)
    if (!step) break
    const decrement = step[0] * current.g[0] + step[1] * current.g[1]
    if (Math.abs(decrement) < 1e-14 * series.length) { converged = true; break }
    let t = 1
    let accepted = false
    for (let k = 0; k < 60; k++, t /= 2) {
      const a2 = alpha + t * step[0]
      const b2 = beta + t * step[1]
      if (!(b2 > 0)) continue
      const next = pass(series, a2, b2)
      if (next.ll >= current.ll - 1e-12 * Math.abs(current.ll)) { alpha = a2; beta = b2; current = next; accepted = true; break }
    }
    if (!accepted) { converged = true; break }
  }
  const covariance = invertSym2(current.observed)
  if (!converged || !covariance || !(covariance[0] > 0) || !(covariance[2] > 0) || !(beta > 0)) {
    throw new CalibrationInputError('The maximum-likelihood fit did not settle; the series holds too little information on the scatter. Add applications around the 50 % level.')
  }
  const z = normalQuantile(0.5 + confidence / 2)
  const logU50 = -alpha / beta
  // Delta method: ∂(−α/β)/∂α = −1/β, ∂(−α/β)/∂β = α/β².
  const d0 = -1 / beta
  const d1 = alpha / (beta * beta)
  const varLogU50 = d0 * d0 * covariance[0] + 2 * d0 * d1 * covariance[1] + d1 * d1 * covariance[2]
  const seLogU50 = Math.sqrt(varLogU50)
  const sigma = 1 / beta
  const seLogSigma = Math.sqrt(covariance[2]) / beta // ln σ = −ln β
  return {
    u50Kv: Math.exp(logU50), sigma, confidence,
    u50Interval: { lo: Math.exp(logU50 - z * seLogU50), hi: Math.exp(logU50 + z * seLogU50) },
    sigmaInterval: { lo: sigma * Math.exp(-z * seLogSigma), hi: sigma * Math.exp(z * seLogSigma) },
    alpha, beta, covariance, logLikelihood: current.ll, gradient: current.g, iterations,
    applications: series.length, sparks: sparks.length,
    method: 'maximum likelihood on the log-normal (probit) model, Fisher scoring; Wald intervals on ln U50 and ln σ from the observed information',
  }
}

/** P(spark) at a level for a fitted law, for drawing the curve. */
export function sparkProbability(levelKv: number, u50Kv: number, sigma: number): number {
  return normalCdf(Math.log(levelKv / u50Kv) / sigma)
}
