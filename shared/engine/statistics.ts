// Interval arithmetic for reported figures.
import jStat from 'jstat'
import { normalQuantile } from './normal'
import type { CountEstimate, Estimate } from './types'

/** Two-sided 95 % normal quantile. */
export const Z95 = 1.959963984540054

/**
 * Exact (Garwood 1936) two-sided 95 % interval for a Poisson mean given an observed count k:
 * [χ²(0.025; 2k)/2, χ²(0.975; 2k+2)/2], i.e. gamma quantiles with shape k and k+1 (jstat).
 */
export function garwoodInterval(count: number, confidence = 0.95): { lo: number; hi: number } {
  const alpha = 1 - confidence
  if (count > LARGE_COUNT) return { lo: wilsonHilferty(count, alpha / 2), hi: wilsonHilferty(count + 1, 1 - alpha / 2) }
  const lo = count === 0 ? 0 : jStat.gamma.inv(alpha / 2, count, 1)
  const hi = jStat.gamma.inv(1 - alpha / 2, count + 1, 1)
  return { lo, hi }
}

/** Above this count the gamma quantile comes from Wilson–Hilferty (relative error < 1e-6 there), not jstat's iteration. */
const LARGE_COUNT = 1000

/** Gamma(shape k, scale 1) quantile at p by the Wilson–Hilferty cube-root normal approximation (1931). */
function wilsonHilferty(k: number, p: number): number {
  const c = 1 / (9 * k)
  const z = normalQuantile(p)
  return k * Math.pow(1 - c + z * Math.sqrt(c), 3)
}

/** A count over `years` simulated years as a rate per year with its Garwood interval. */
export function countEstimate(count: number, years: number): CountEstimate {
  const { lo, hi } = garwoodInterval(count)
  return { count, rate: count / years, lo: lo / years, hi: hi / years }
}

/** An estimate with a normal-approximation 95 % interval floored at 0 (rates cannot be negative). */
export function normalEstimate(rate: number, se: number): Estimate {
  return { rate, se, lo: Math.max(0, rate - Z95 * se), hi: rate + Z95 * se }
}

/** Sum of independent estimates: rates add, variances add. */
export function sumEstimates(parts: readonly Estimate[]): Estimate {
  let rate = 0
  let variance = 0
  for (const p of parts) { rate += p.rate; variance += p.se * p.se }
  return normalEstimate(rate, Math.sqrt(variance))
}

/** An estimate times a constant (e.g. ignition frequency × severity = expected annual loss). */
export function scaleEstimate(e: Estimate, factor: number): Estimate {
  return { ...e, rate: e.rate * factor, se: e.se * factor, lo: e.lo * factor, hi: e.hi * factor }
}

/** Mean and standard error of the mean of a sample. */
export function meanAndStandardError(values: ArrayLike<number>): { mean: number; se: number } {
  const n = values.length
  if (n === 0) return { mean: 0, se: 0 }
  let sum = 0
  for (let i = 0; i < n; i++) sum += values[i]!
  const mean = sum / n
  let ss = 0
  for (let i = 0; i < n; i++) { const d = values[i]! - mean; ss += d * d }
  return { mean, se: n > 1 ? Math.sqrt(ss / (n - 1) / n) : 0 }
}
