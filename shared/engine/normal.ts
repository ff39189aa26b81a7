// Standard normal distribution: CDF and quantile, fast enough for the inner loop.

const SQRT1_2 = Math.SQRT1_2

/**
 * Complementary error function, Chebyshev fit "erfcc" from Press, Teukolsky, Vetterling & Flannery,
 * Numerical Recipes in C, 2nd ed. (1992), §6.2: fractional error below 1.2e-7 everywhere,
 * including the far tails — which matters because sparking probabilities of 1e-6 still add up
 * over square kilometres. One exp and one division, no allocation.
 */
export function erfc(x: number): number {
  const z = x < 0 ? -x : x
  const t = 1 / (1 + 0.5 * z)
  const r = t * Math.exp(-z * z - 1.26551223 + t * (1.00002368 + t * (0.37409196 + t * (0.09678418
    + t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587
    + t * (-0.82215223 + t * 0.17087277)))))))))
  return x >= 0 ? r : 2 - r
}

/** Φ(z). Beyond |z| = 38 the result is exactly 0 or 1 in double precision anyway. */
export function normalCdf(z: number): number {
  if (z < -38) return 0
  if (z > 38) return 1
  return 0.5 * erfc(-z * SQRT1_2)
}

// Coefficients of P. J. Acklam's rational approximation of the normal quantile (2003),
// relative error below 1.15e-9 over (0, 1).
const A0 = -3.969683028665376e+01, A1 = 2.209460984245205e+02, A2 = -2.759285104469687e+02
const A3 = 1.383577518672690e+02, A4 = -3.066479806614716e+01, A5 = 2.506628277459239e+00
const B0 = -5.447609879822406e+01, B1 = 1.615858368580409e+02, B2 = -1.556989798598866e+02
const B3 = 6.680131188771972e+01, B4 = -1.328068155288572e+01
const C0 = -7.784894002430293e-03, C1 = -3.223964580411365e-01, C2 = -2.400758277161838e+00
const C3 = -2.549732539343734e+00, C4 = 4.374664141464968e+00, C5 = 2.938163982698783e+00
const D0 = 7.784695709041462e-03, D1 = 3.224671290700398e-01, D2 = 2.445134137142996e+00
const D3 = 3.754408661907416e+00
const P_LOW = 0.02425

/** Φ⁻¹(p) for p in (0, 1); ±Infinity at the ends. Acklam (2003). */
export function normalQuantile(p: number): number {
  if (p <= 0) return -Infinity
  if (p >= 1) return Infinity
  if (p < P_LOW) return tailQuantile(p)
  if (p > 1 - P_LOW) return -tailQuantile(1 - p)
  const q = p - 0.5
  const r = q * q
  return (((((A0 * r + A1) * r + A2) * r + A3) * r + A4) * r + A5) * q
    / (((((B0 * r + B1) * r + B2) * r + B3) * r + B4) * r + 1)
}

function tailQuantile(p: number): number {
  const q = Math.sqrt(-2 * Math.log(p))
  return (((((C0 * q + C1) * q + C2) * q + C3) * q + C4) * q + C5)
    / ((((D0 * q + D1) * q + D2) * q + D3) * q + 1)
}
