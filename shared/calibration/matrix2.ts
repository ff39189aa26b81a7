// 2 × 2 symmetric matrices for two-parameter Newton steps and covariance matrices.

export type Sym2 = [number, number, number] // [a11, a12, a22]

export function invertSym2([a, b, d]: Sym2): Sym2 | null {
  const det = a * d - b * b
  if (!Number.isFinite(det) || det === 0) return null
  return [d / det, -b / det, a / det]
}

/** True when −H is positive definite, i.e. H is a maximum's Hessian. */
export function isNegativeDefinite([a, b, d]: Sym2): boolean {
  return a < 0 && a * d - b * b > 0
}

export function solveSym2(m: Sym2, v: [number, number]): [number, number] | null {
  const inv = invertSym2(m)
  if (!inv) return null
  return [inv[0] * v[0] + inv[1] * v[1], inv[1] * v[0] + inv[2] * v[1]]
}
