// First-stroke peak current distributions (MODEL.md §1): sampled by inversion, truncated to
// [Imin, Imax] and renormalised.
import { normalCdf, normalQuantile } from './normal'

export type CurrentLawSpec =
  | { kind: 'power_law'; medianKa: number; exponent: number }
  | { kind: 'lognormal'; medianKa: number; beta: number }
  | { kind: 'empirical'; currentsKa: readonly number[] }

/** An untruncated current law. */
export interface CurrentLaw {
  readonly kind: CurrentLawSpec['kind']
  /** P(I ≤ i). */
  cdf(i: number): number
  /** P(I ≥ i), computed directly so the upper tail keeps its precision. */
  exceedance(i: number): number
  /** Inverse of cdf on (0, 1). */
  quantile(u: number): number
  /** ln of the quantile, computed without the round trip through I (saves a log in the hot loops). */
  logQuantile(u: number): number
  /** Density of ln I at s; null for the empirical law (piecewise, integrated in probability space). */
  logDensity: ((s: number) => number) | null
}

/**
 * IEEE Std 1410 (after Anderson & Eriksson): P(I ≥ i) = 1 / (1 + (i/M)^k), M = 31 kA, k = 2.6.
 * Inversion: i = M·(u/(1−u))^(1/k) for the non-exceedance probability u.
 */
export function powerLaw(medianKa: number, exponent: number): CurrentLaw {
  const invK = 1 / exponent
  const lnM = Math.log(medianKa)
  return {
    kind: 'power_law',
    cdf: (i) => (i <= 0 ? 0 : 1 - 1 / (1 + Math.pow(i / medianKa, exponent))),
    exceedance: (i) => (i <= 0 ? 1 : 1 / (1 + Math.pow(i / medianKa, exponent))),
    quantile: (u) => medianKa * Math.pow(u / (1 - u), invK),
    logQuantile: (u) => lnM + invK * Math.log(u / (1 - u)),
    logDensity: (s) => {
      const x = Math.pow(Math.exp(s) / medianKa, exponent)
      return exponent * x / ((1 + x) * (1 + x))
    },
  }
}

/** Log-normal with median M and log standard deviation β (CIGRE first negative strokes: 31.1 kA, 0.484). */
export function lognormalLaw(medianKa: number, beta: number): CurrentLaw {
  const lnM = Math.log(medianKa)
  const norm = 1 / (beta * Math.sqrt(2 * Math.PI))
  return {
    kind: 'lognormal',
    cdf: (i) => (i <= 0 ? 0 : normalCdf((Math.log(i) - lnM) / beta)),
    exceedance: (i) => (i <= 0 ? 1 : normalCdf((lnM - Math.log(i)) / beta)),
    quantile: (u) => Math.exp(lnM + beta * normalQuantile(u)),
    logQuantile: (u) => lnM + beta * normalQuantile(u),
    logDensity: (s) => {
      const z = (s - lnM) / beta
      return norm * Math.exp(-0.5 * z * z)
    },
  }
}

/**
 * Empirical law from recorded peak currents: the quantile function interpolates linearly in ln I
 * between the sorted records at plotting positions j/(n−1) (Hyndman & Fan type 7, the default of
 * R and NumPy, applied to log current because currents span two decades).
 */
export function empiricalLaw(currentsKa: readonly number[]): CurrentLaw {
  const logs = Float64Array.from(currentsKa, (i) => Math.log(i)).sort()
  const last = logs.length - 1
  if (last < 1) throw new RangeError('an empirical current law needs at least two recorded currents')
  const cdf = (i: number): number => {
    if (i <= 0) return 0
    const s = Math.log(i)
    if (s < logs[0]!) return 0
    if (s >= logs[last]!) return 1
    const j = lastIndexAtOrBelow(logs, s)
    return (j + (s - logs[j]!) / (logs[j + 1]! - logs[j]!)) / last
  }
  const logQuantile = (u: number): number => {
    const x = u * last
    const j = Math.min(Math.floor(x), last - 1)
    return logs[j]! + (x - j) * (logs[j + 1]! - logs[j]!)
  }
  return {
    kind: 'empirical',
    cdf,
    exceedance: (i) => 1 - cdf(i),
    quantile: (u) => Math.exp(logQuantile(u)),
    logQuantile,
    logDensity: null,
  }
}

/** Largest j with sorted[j] ≤ s, for s inside [sorted[0], sorted[last]). */
function lastIndexAtOrBelow(sorted: Float64Array, s: number): number {
  let lo = 0
  let hi = sorted.length - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (sorted[mid]! <= s) lo = mid
    else hi = mid
  }
  return lo
}

export function currentLawFromSpec(spec: CurrentLawSpec): CurrentLaw {
  switch (spec.kind) {
    case 'power_law': return powerLaw(spec.medianKa, spec.exponent)
    case 'lognormal': return lognormalLaw(spec.medianKa, spec.beta)
    case 'empirical': return empiricalLaw(spec.currentsKa)
  }
}

/** A law truncated to [minKa, maxKa] and renormalised; u ∈ (0, 1) maps to the truncated quantile. */
export interface TruncatedCurrentLaw {
  readonly law: CurrentLaw
  readonly minKa: number
  readonly maxKa: number
  /** cdf(minKa) and cdf(maxKa) of the untruncated law. */
  readonly uLo: number
  readonly uHi: number
  quantile(u: number): number
  logQuantile(u: number): number
  cdf(i: number): number
  exceedance(i: number): number
}

export function truncate(law: CurrentLaw, minKa: number, maxKa: number): TruncatedCurrentLaw {
  const uLo = law.cdf(minKa)
  const uHi = law.cdf(maxKa)
  const mass = uHi - uLo
  if (!(mass > 0)) throw new RangeError(`the current law has no probability between ${minKa} and ${maxKa} kA`)
  const tailHi = law.exceedance(maxKa)
  const lnMin = Math.log(minKa)
  const lnMax = Math.log(maxKa)
  return {
    law, minKa, maxKa, uLo, uHi,
    quantile: (u) => {
      const i = law.quantile(uLo + u * mass)
      return i < minKa ? minKa : i > maxKa ? maxKa : i
    },
    logQuantile: (u) => {
      const s = law.logQuantile(uLo + u * mass)
      return s < lnMin ? lnMin : s > lnMax ? lnMax : s
    },
    cdf: (i) => (i <= minKa ? 0 : i >= maxKa ? 1 : (law.cdf(i) - uLo) / mass),
    exceedance: (i) => (i <= minKa ? 1 : i >= maxKa ? 0 : (law.exceedance(i) - tailHi) / mass),
  }
}
