// Sobol' group indices (issue "How sure are we": many uncertain assumptions) — the estimator on
// closed forms, the cost formula of the design and the plan taking natural groups when the
// assumptions are many. Every expected value is a closed form.
import { describe, expect, it } from 'vitest'
import { parseAssumptions } from '../../../shared/engine/assumptions'
import { evaluationCount, MAX_SINGLE_FACTORS, naturalGroupOf, planAssumptionDraws } from '../../../shared/engine/draws'
import { sobolIndices } from '../../../shared/engine/sensitivity'
import { createStream } from '../../../shared/engine/random'
import { illustrativeUncertainty } from '../../../shared/engine/uncertainty-defaults'
import { calibrationPageFor } from '../../../shared/results/sensitivity-chart'

/** Saltelli's design with groups: A_B^g is A with every column of group g taken from B. */
function groupDesign(f: (x: number[]) => number, d: number, groups: number[][], N: number, sample: () => number) {
  const A = Array.from({ length: N }, () => Array.from({ length: d }, sample))
  const B = Array.from({ length: N }, () => Array.from({ length: d }, sample))
  return sobolIndices({
    fA: A.map(f), fB: B.map(f),
    fAB: groups.map((g) => A.map((row, j) => f(row.map((v, k) => (g.includes(k) ? B[j]![k]! : v))))),
  }, { seed: 2 })
}

describe('group indices on the Ishigami function', () => {
  // Ishigami & Homma (1990), closed-form decomposition (Sobol' & Levitan 1999; Saltelli et al. 2008,
  // "Global Sensitivity Analysis. The Primer", §1.2.15 for group indices): V1 = bπ⁴/5 + b²π⁸/50 + 1/2,
  // V2 = a²/8, V3 = 0, V13 = 8b²π⁸/225, all other terms 0. For the group u = {x1, x3}:
  // S_u (closed index) = (V1 + V3 + V13)/V, ST_u = S_u (x2 enters alone); for {x2}: S = ST = V2/V.
  const a = 7, b = 0.1, pi = Math.PI
  const V = a * a / 8 + b * pi ** 4 / 5 + b * b * pi ** 8 / 18 + 0.5
  const V1 = b * pi ** 4 / 5 + b * b * pi ** 8 / 50 + 0.5
  const V2 = a * a / 8
  const V13 = 8 * b * b * pi ** 8 / 225
  const f = (x: number[]) => Math.sin(x[0]!) + a * Math.sin(x[1]!) ** 2 + b * x[2]! ** 4 * Math.sin(x[0]!)
  const rand = createStream(5, 'ishigami-groups', 'test')
  const out = groupDesign(f, 3, [[0, 2], [1]], 20_000, () => -pi + 2 * pi * rand())
  const expected = [(V1 + V13) / V, V2 / V]

  it('the closed form: S_{x1,x3} + S_{x2} = 1 (no interaction across the groups)', () => {
    expect(expected[0]! + expected[1]!).toBeCloseTo(1, 12)
    expect(expected[0]).toBeCloseTo(0.5576, 4) // = ST1 of Saltelli et al. (2010) (x3 acts only with x1)
  })
  it('first-order and total-effect group indices within 3 bootstrap standard errors', () => {
    for (let g = 0; g < 2; g++) {
      expect(Math.abs(out.firstOrder[g]!.estimate - expected[g]!)).toBeLessThanOrEqual(3 * out.firstOrder[g]!.se)
      expect(Math.abs(out.totalEffect[g]!.estimate - expected[g]!)).toBeLessThanOrEqual(3 * out.totalEffect[g]!.se)
      expect(out.firstOrder[g]!.se).toBeLessThan(0.03)
      expect(out.totalEffect[g]!.se).toBeLessThan(0.03)
    }
  })
})

describe('group indices on the Sobol\' g-function', () => {
  // g(x) = Π (|4x_i − 2| + a_i)/(1 + a_i), x_i ~ U(0, 1) (Sobol' 1993; Saltelli et al. 2010):
  // V_i = (1/3)/(1 + a_i)², V = Π(1 + V_i) − 1, and for a group u the closed index is
  // S_u = (Π_{i∈u}(1 + V_i) − 1)/V, the total ST_u = 1 − (Π_{i∉u}(1 + V_i) − 1)/V.
  const as = [0, 1, 4.5, 9, 99, 99]
  const Vi = as.map((ai) => 1 / 3 / (1 + ai) ** 2)
  const prod = (idx: number[]) => idx.reduce((p, i) => p * (1 + Vi[i]!), 1)
  const all = as.map((_, i) => i)
  const V = prod(all) - 1
  const groups = [[0, 1], [2, 3], [4, 5]]
  const first = groups.map((u) => (prod(u) - 1) / V)
  const total = groups.map((u) => 1 - (prod(all.filter((i) => !u.includes(i))) - 1) / V)
  const g = (x: number[]) => x.reduce((p, xi, i) => p * (Math.abs(4 * xi - 2) + as[i]!) / (1 + as[i]!), 1)
  const rand = createStream(7, 'g-function', 'test')
  const out = groupDesign(g, 6, groups, 20_000, rand)

  it('group indices within 3 bootstrap standard errors of the closed form', () => {
    expect(first[0]).toBeGreaterThan(0.8) // the two important inputs dominate
    for (let k = 0; k < groups.length; k++) {
      expect(Math.abs(out.firstOrder[k]!.estimate - first[k]!)).toBeLessThanOrEqual(3 * out.firstOrder[k]!.se + 1e-9)
      expect(Math.abs(out.totalEffect[k]!.estimate - total[k]!)).toBeLessThanOrEqual(3 * out.totalEffect[k]!.se + 1e-9)
    }
    expect(out.firstOrder[0]!.se).toBeLessThan(0.03)
  })
})

describe('the plan takes natural groups when the assumptions are many', () => {
  const K = 6
  it('the 26 illustrative default ranges: 7 group factors, every assumption in exactly one', () => {
    const set = parseAssumptions({ uncertainty: illustrativeUncertainty() })
    const plan = planAssumptionDraws(set, { draws: K, runSeed: 1 })
    expect(plan.entries.length).toBe(26)
    // current law, coupling, sparking levels, ignition, damage, fire spread, flash density
    expect(plan.factors.length).toBe(7)
    expect(plan.factors.length).toBeLessThanOrEqual(MAX_SINGLE_FACTORS)
    const paths = plan.factors.flatMap((f) => f.paths).sort()
    expect(paths).toEqual(plan.entries.map((e) => e.path).sort())
    // every group holds one natural group only, and says what it holds
    for (const f of plan.factors) {
      expect(new Set(f.paths.map((p) => naturalGroupOf(p).key)).size).toBe(1)
      if (f.paths.length > 1) expect(f.members?.map((m) => m.path)).toEqual(f.paths)
    }
    const sparking = plan.factors.find((f) => f.paths.includes('thresholds.sharp_device.u50Kv'))!
    expect(sparking.paths.length).toBe(8) // U50 and σ of the 4 component classes
    expect(sparking.paths.every((p) => p.startsWith('thresholds.'))).toBe(true)
    expect(calibrationPageFor(sparking.path)?.to).toBe('/calibration/impulse')
    // the cost: 1 + K + N·factors evaluations (N = K/2: A and B are the band draws); A_B^g swaps the whole group
    expect(plan.baseSamples).toBe(K / 2)
    expect(evaluationCount(plan)).toBe(1 + K + (K / 2) * plan.factors.length)
    expect(plan.ab.length).toBe(plan.factors.length)
    const g = plan.factors.indexOf(sparking)
    for (let j = 0; j < K / 2; j++) {
      expect(plan.b[j]).toBe(plan.a[K / 2 + j])
      const t = plan.ab[g]![j]!.assumptions.thresholds.sharp_device
      expect(t).toEqual(plan.b[j]!.assumptions.thresholds.sharp_device)
      expect(plan.ab[g]![j]!.assumptions.thresholds.grounded_pipe).toEqual(plan.b[j]!.assumptions.thresholds.grounded_pipe)
      expect(plan.ab[g]![j]!.assumptions.ignitionGivenSpark).toEqual(plan.a[j]!.assumptions.ignitionGivenSpark)
    }
  })
  it('few assumptions stay one by one; a correlated pair stays in one factor when grouped', () => {
    const few = parseAssumptions({ uncertainty: { entries: illustrativeUncertainty().entries.slice(0, 5), correlations: [] } })
    expect(planAssumptionDraws(few, { draws: K, runSeed: 1 }).factors.length).toBe(5)
    const u = illustrativeUncertainty()
    u.correlations.push({ a: 'flashDensityFactor', b: 'returnStrokeVelocity', rho: 0.4 })
    const plan = planAssumptionDraws(parseAssumptions({ uncertainty: u }), { draws: K, runSeed: 1 })
    const f = plan.factors.find((x) => x.paths.includes('flashDensityFactor'))!
    expect(f.paths.sort()).toEqual(['flashDensityFactor', 'returnStrokeVelocity'])
    expect(plan.factors.length).toBeLessThanOrEqual(MAX_SINGLE_FACTORS)
  })
})
