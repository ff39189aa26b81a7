// Variance-based sensitivity (issue "How sure are we"): first-order and total-effect indices of a
// model output per uncertain input, from Saltelli's sampling design with Jansen's estimators
// (A. Saltelli, P. Annoni, I. Azzini, F. Campolongo, M. Ratto, S. Tarantola 2010, "Variance based
// sensitivity analysis of model output. Design and estimator for the total sensitivity index",
// Comput. Phys. Commun. 181, 259–270, Table 2 rows (f) and (b); M. J. W. Jansen 1999).
//
// Design: two independent N × d sample matrices A and B, and for each input (or group of inputs) i
// the matrix A_B^i — A with column(s) i taken from B. With f_A, f_B, f_{A_B^i} the model outputs:
//   V      = variance of all 2N outputs of A and B
//   V_i    = V − (1/2N) Σ_j (f_B,j − f_{A_B^i},j)²       (first order, Jansen)
//   V_Ti   = (1/2N) Σ_j (f_A,j − f_{A_B^i},j)²            (total effect, Jansen)
//   S_i = V_i / V, S_Ti = V_Ti / V.
// Their sampling error: a bootstrap over the N rows (the rows are independent; resampling them
// resamples A, B and every A_B^i together), seeded, so the same outputs give the same errors.
import { createStream } from './random'

/** One index with its bootstrap standard error. */
export interface IndexEstimate { estimate: number; se: number }

/** Stored per uncertain assumption (or group of correlated assumptions taken together). */
export interface SensitivityIndex {
  /** Dotted assumption path; for a group of correlated assumptions, the paths joined by " + ". */
  path: string
  label: string
  unit: string
  /** For a group of assumptions (correlated, or a natural group of a plan with many factors): what it holds. Group indices (Sobol' indices of the group's inputs taken together). */
  members?: { path: string; label: string; unit: string }[]
  firstOrder: IndexEstimate
  totalEffect: IndexEstimate
}

export interface SensitivityResult {
  metric: 'expectedFires' | 'aal'
  /** N, the rows of each of the matrices A and B. */
  baseSamples: number
  indices: SensitivityIndex[]
}

/** Model outputs on Saltelli's design: f(A), f(B) and f(A_B^i) per input i (each of length N). */
export interface SaltelliOutputs {
  fA: ArrayLike<number>
  fB: ArrayLike<number>
  fAB: readonly ArrayLike<number>[]
}

export interface SobolEstimates {
  variance: number
  firstOrder: IndexEstimate[]
  totalEffect: IndexEstimate[]
}

interface PointEstimates { first: Float64Array; total: Float64Array; variance: number }

function pointEstimates(o: SaltelliOutputs, rows: ArrayLike<number>): PointEstimates {
  const n = rows.length
  const d = o.fAB.length
  let sum = 0, sum2 = 0
  for (let k = 0; k < n; k++) {
    const j = rows[k]!
    const a = o.fA[j]!, b = o.fB[j]!
    sum += a + b
    sum2 += a * a + b * b
  }
  const mean = sum / (2 * n)
  const variance = Math.max(0, sum2 / (2 * n) - mean * mean) * (2 * n) / Math.max(1, 2 * n - 1)
  const first = new Float64Array(d)
  const total = new Float64Array(d)
  for (let i = 0; i < d; i++) {
    const ab = o.fAB[i]!
    let sb = 0, sa = 0
    for (let k = 0; k < n; k++) {
      const j = rows[k]!
      const x = ab[j]!
      sb += (o.fB[j]! - x) ** 2
      sa += (o.fA[j]! - x) ** 2
    }
    if (variance > 0) {
      first[i] = (variance - sb / (2 * n)) / variance
      total[i] = sa / (2 * n) / variance
    }
  }
  return { first, total, variance }
}

/**
 * First-order and total-effect indices with bootstrap standard errors (`resamples` bootstrap
 * replicates over the N rows, stream seeded by `seed`). An output with no variance gives 0 indices.
 */
export function sobolIndices(o: SaltelliOutputs, options: { resamples?: number; seed?: string | number } = {}): SobolEstimates {
  const n = o.fA.length
  if (o.fB.length !== n || o.fAB.some((x) => x.length !== n)) throw new RangeError('f(A), f(B) and every f(A_B^i) need the same number of rows')
  const d = o.fAB.length
  const all = Int32Array.from({ length: n }, (_, j) => j)
  const point = pointEstimates(o, all)
  const resamples = options.resamples ?? 200
  const rand = createStream(options.seed ?? 1, 'sensitivity', 'bootstrap')
  const s1 = new Float64Array(d), s1s = new Float64Array(d), st = new Float64Array(d), sts = new Float64Array(d)
  const rows = new Int32Array(n)
  for (let b = 0; b < resamples; b++) {
    for (let k = 0; k < n; k++) rows[k] = Math.floor(rand() * n)
    const e = pointEstimates(o, rows)
    for (let i = 0; i < d; i++) {
      s1[i]! += e.first[i]!; s1s[i]! += e.first[i]! ** 2
      st[i]! += e.total[i]!; sts[i]! += e.total[i]! ** 2
    }
  }
  const sd = (s: number, s2: number) => resamples > 1 ? Math.sqrt(Math.max(0, (s2 - s * s / resamples) / (resamples - 1))) : 0
  return {
    variance: point.variance,
    firstOrder: Array.from(point.first, (estimate, i) => ({ estimate, se: sd(s1[i]!, s1s[i]!) })),
    totalEffect: Array.from(point.total, (estimate, i) => ({ estimate, se: sd(st[i]!, sts[i]!) })),
  }
}
