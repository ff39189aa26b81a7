// Assumption draws, their propagation on common random numbers and the sensitivity estimator
// (issue "How sure are we"). Every expected value is a closed form or a published table.
import { describe, expect, it } from 'vitest'
import { parseAssumptions } from '../../../shared/engine/assumptions'
import { planAssumptionDraws, planEvaluations } from '../../../shared/engine/draws'
import { bandOf, drawsOf, sensitivityOf, siteDrawValues, summariseSiteDraws } from '../../../shared/engine/draw-figures'
import { sobolIndices } from '../../../shared/engine/sensitivity'
import { ruskCoupling } from '../../../shared/engine/induction'
import { lateralAttractionDistance } from '../../../shared/engine/attachment'
import { isolatedTankQuadrature } from '../../../shared/engine/quadrature'
import { createStream } from '../../../shared/engine/random'
import { expectedBurningTankLoss } from '../../../shared/engine/loss'
import { battery, makeSite, makeTank } from './fixtures'

const lognormal = (path: string, median: number, sigmaLn: number) => ({ path, distribution: { kind: 'lognormal' as const, median, sigmaLn }, basis: 'analyst' as const, note: '' })

describe('the sensitivity estimator on the Ishigami function', () => {
  // Ishigami & Homma (1990): f = sin x1 + a sin² x2 + b x3⁴ sin x1, x_i ~ U(−π, π), a = 7, b = 0.1.
  // Closed form (Sobol' & Levitan 1999; tabulated by Saltelli et al. 2010): V = a²/8 + bπ⁴/5 + b²π⁸/18 + 1/2,
  // V1 = bπ⁴/5 + b²π⁸/50 + 1/2, V2 = a²/8, V3 = 0, V13 = 8b²π⁸/225 — S1 0.3139, S2 0.4424, S3 0, ST1 0.5576, ST2 0.4424, ST3 0.2437.
  const a = 7, b = 0.1, pi = Math.PI
  const V = a * a / 8 + b * pi ** 4 / 5 + b * b * pi ** 8 / 18 + 0.5
  const V1 = b * pi ** 4 / 5 + b * b * pi ** 8 / 50 + 0.5
  const V2 = a * a / 8
  const V13 = 8 * b * b * pi ** 8 / 225
  const expected = { first: [V1 / V, V2 / V, 0], total: [(V1 + V13) / V, V2 / V, V13 / V] }
  const f = (x: number[]) => Math.sin(x[0]!) + a * Math.sin(x[1]!) ** 2 + b * x[2]! ** 4 * Math.sin(x[0]!)
  const N = 20_000
  const rand = createStream(3, 'ishigami', 'test')
  const A = Array.from({ length: N }, () => [0, 1, 2].map(() => -pi + 2 * pi * rand()))
  const B = Array.from({ length: N }, () => [0, 1, 2].map(() => -pi + 2 * pi * rand()))
  const out = sobolIndices({
    fA: A.map(f), fB: B.map(f),
    fAB: [0, 1, 2].map((i) => A.map((row, j) => f(row.map((v, k) => (k === i ? B[j]![k]! : v))))),
  }, { seed: 1 })

  it('the closed form gives the tabulated values', () => {
    expect(expected.first[0]).toBeCloseTo(0.3139, 4) // Saltelli et al. (2010) / Sobol' & Levitan
    expect(expected.first[1]).toBeCloseTo(0.4424, 4)
    expect(expected.total[0]).toBeCloseTo(0.5576, 4)
    expect(expected.total[2]).toBeCloseTo(0.2437, 4)
  })
  it('first-order and total-effect indices within 3 of their bootstrap standard errors', () => {
    for (let i = 0; i < 3; i++) {
      expect(Math.abs(out.firstOrder[i]!.estimate - expected.first[i]!)).toBeLessThanOrEqual(3 * out.firstOrder[i]!.se)
      expect(Math.abs(out.totalEffect[i]!.estimate - expected.total[i]!)).toBeLessThanOrEqual(3 * out.totalEffect[i]!.se)
      // … and the errors are small enough for the comparison to mean something
      expect(out.firstOrder[i]!.se).toBeLessThan(0.03)
      expect(out.totalEffect[i]!.se).toBeLessThan(0.03)
    }
  })
})

describe('draws honour correlations and bounds', () => {
  const K = 400
  // The crude value sits near its upper bound so that the truncation at 1 is exercised (an
  // uncertainty must cover its set's value).
  const set = parseAssumptions({ ignitionGivenSpark: { crude: 0.95 }, uncertainty: {
    entries: [
      lognormal('thresholds.sharp_device.u50Kv', 70, 0.2),
      lognormal('thresholds.grounded_pipe.u50Kv', 100, 0.3),
      { path: 'ignitionGivenSpark.crude', distribution: { kind: 'normal', mean: 0.95, sd: 0.2 }, basis: 'analyst', note: '' },
      { path: 'thresholds.carbon_fibre.sigma', distribution: { kind: 'normal', mean: 0.3, sd: 0.2, min: 0.1, max: 0.5 }, basis: 'analyst', note: '' },
    ],
    correlations: [{ a: 'thresholds.sharp_device.u50Kv', b: 'thresholds.grounded_pipe.u50Kv', rho: 0.6 }],
  } })
  const plan = planAssumptionDraws(set, { draws: K, runSeed: 11 })

  it('the sample correlation of the log-normal pair is ρ within 3 of its sampling errors', () => {
    const x = Array.from(plan.valuesA[0]!, Math.log)
    const y = Array.from(plan.valuesA[1]!, Math.log)
    const mean = (v: number[]) => v.reduce((s, u) => s + u, 0) / v.length
    const mx = mean(x), my = mean(y)
    let sxy = 0, sxx = 0, syy = 0
    for (let i = 0; i < K; i++) { sxy += (x[i]! - mx) * (y[i]! - my); sxx += (x[i]! - mx) ** 2; syy += (y[i]! - my) ** 2 }
    const r = sxy / Math.sqrt(sxx * syy)
    // large-sample standard error of a Pearson correlation of normals: (1 − ρ²)/√K (common practice)
    expect(Math.abs(r - 0.6)).toBeLessThanOrEqual(3 * (1 - 0.36) / Math.sqrt(K))
    // a correlated pair is one factor of the sensitivity analysis
    expect(plan.factors.map((f) => f.paths.length)).toEqual([2, 1, 1])
  })
  it('each of the two Latin hypercubes of the band draws puts one draw in each of its strata of each marginal', () => {
    // ln U50 ~ N(ln 70, 0.2): stratum of a draw among n = ⌊n·Φ(z)⌋, all different within each hypercube
    // (McKay, Beckman & Conover 1979); the first holds ⌈K/2⌉ rows, the second ⌊K/2⌋
    const stratum = (v: number, n: number) => Math.floor(n * (0.5 + 0.5 * erf((Math.log(v / 70) / 0.2) / Math.SQRT2)))
    const first = Array.from(plan.valuesA[0]!.subarray(0, K / 2), (v) => stratum(v, K / 2))
    const second = Array.from(plan.valuesA[0]!.subarray(K / 2), (v) => stratum(v, K / 2))
    expect(new Set(first).size).toBe(K / 2)
    expect(new Set(second).size).toBe(K / 2)
    // B of the sensitivity design is the second hypercube itself (no evaluations of its own)
    expect(plan.baseSamples).toBe(K / 2)
    expect(plan.b).toEqual(plan.a.slice(K / 2))
  })
  it('truncation to the valid range and to the given bounds', () => {
    const crude = Array.from(plan.valuesA[2]!)
    expect(Math.max(...crude)).toBeLessThanOrEqual(1) // a probability
    expect(crude.filter((v) => v > 0.95).length).toBeGreaterThan(0)
    const sigma = Array.from(plan.valuesA[3]!)
    expect(Math.min(...sigma)).toBeGreaterThanOrEqual(0.1)
    expect(Math.max(...sigma)).toBeLessThanOrEqual(0.5)
    for (const d of [...plan.a, ...plan.b, ...plan.ab.flat()]) expect(d.assumptions.ignitionGivenSpark.crude).toBeLessThanOrEqual(1)
  })
  it('a correlation matrix that is not positive definite is refused with a clear message', () => {
    const bad = parseAssumptions({ uncertainty: {
      entries: [lognormal('thresholds.sharp_device.u50Kv', 70, 0.2), lognormal('thresholds.grounded_pipe.u50Kv', 100, 0.2), lognormal('thresholds.carbon_fibre.u50Kv', 90, 0.2)],
      correlations: [
        { a: 'thresholds.sharp_device.u50Kv', b: 'thresholds.grounded_pipe.u50Kv', rho: 0.9 },
        { a: 'thresholds.grounded_pipe.u50Kv', b: 'thresholds.carbon_fibre.u50Kv', rho: 0.9 },
        { a: 'thresholds.sharp_device.u50Kv', b: 'thresholds.carbon_fibre.u50Kv', rho: -0.9 },
      ],
    } })
    expect(() => planAssumptionDraws(bad, { draws: 50, runSeed: 1 })).toThrow(/not positive definite/)
  })
  it('assumptions the shared flashes fix are refused for draws; an illustrative range on them is left out and reported', () => {
    const bad = parseAssumptions({ uncertainty: { entries: [lognormal('strikingDistanceA', 10, 0.1), lognormal('thresholds.sharp_device.u50Kv', 70, 0.2)], correlations: [] } })
    expect(() => planAssumptionDraws(bad, { draws: 50, runSeed: 1 })).toThrow(/strikingDistanceA: cannot be drawn/)
    const illustrative = parseAssumptions({ uncertainty: { entries: [{ ...lognormal('strikingDistanceA', 10, 0.1), basis: 'illustrative' }, lognormal('thresholds.sharp_device.u50Kv', 70, 0.2)], correlations: [] } })
    const plan = planAssumptionDraws(illustrative, { draws: 50, runSeed: 1 })
    expect(plan.leftOut.map((l) => l.path)).toEqual(['strikingDistanceA'])
    expect(plan.factors.map((f) => f.path)).toEqual(['thresholds.sharp_device.u50Kv'])
    for (const d of plan.a) expect(d.assumptions.strikingDistanceA).toBe(10)
  })
  it('a damage-ratio sd too large for a drawn mean is clamped, and every drawn set is valid', () => {
    // Each range is valid against the other's central value (sd 0.4 < √(m(1 − m)) for m in 0.6–0.79; mean 0.7
    // allows sd up to 0.458), but a draw of a high mean with a high sd is not: that pair is clamped.
    const s = parseAssumptions({ damageRatio: { replacement: { mean: 0.7, sd: 0.4 } }, uncertainty: { entries: [
      { path: 'damageRatio.replacement.mean', distribution: { kind: 'uniform', min: 0.6, max: 0.79 }, basis: 'analyst', note: '' },
      { path: 'damageRatio.replacement.sd', distribution: { kind: 'uniform', min: 0.3, max: 0.45 }, basis: 'analyst', note: '' },
    ], correlations: [] } })
    const p = planAssumptionDraws(s, { draws: 50, runSeed: 2 })
    expect(p.clamped).toBeGreaterThan(0)
    for (const d of p.a) expect(d.assumptions.damageRatio.replacement.sd ** 2).toBeLessThan(d.assumptions.damageRatio.replacement.mean * (1 - d.assumptions.damageRatio.replacement.mean))
  })
  it('deterministic in (seed, assumptions)', () => {
    expect(planAssumptionDraws(set, { draws: 60, runSeed: 5 }).valuesA.map((v) => Array.from(v))).toEqual(planAssumptionDraws(set, { draws: 60, runSeed: 5 }).valuesA.map((v) => Array.from(v)))
  })
})

function erf(x: number): number {
  // from Φ: erf(x) = 2Φ(x√2) − 1, Φ through its inverse's bisection is overkill; Abramowitz & Stegun 7.1.26 (|error| < 1.5e-7)
  const t = 1 / (1 + 0.3275911 * Math.abs(x))
  const y = 1 - (((((1.061405429 * t - 1.453152027) * t) + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-x * x)
  return x >= 0 ? y : -y
}

describe('propagation on common random numbers', () => {
  it('with only the flash-density factor uncertain, every band is the factor\'s band × the central figure', () => {
    const set = parseAssumptions({ uncertainty: { entries: [lognormal('flashDensityFactor', 1, 0.3)], correlations: [] } })
    const plan = planAssumptionDraws(set, { draws: 80, runSeed: 4 })
    const site = battery()
    const v = siteDrawValues(site, plan, { runSeed: 4, samples: 2000 })
    // invented central figures: the bands scale them
    const central = site.tanks.map((_, t) => ({ direct: 1e-4 * (t + 1), sparking: 0.1 * (t + 1), ignition: 0.03 * (t + 1), expectedAnnualLoss: 500 * (t + 1) }))
    const s = summariseSiteDraws(v, central, plan, 4)
    const factor = bandOf(plan.valuesA[0]!)
    s.tanks.forEach((bands, t) => {
      for (const m of ['direct', 'sparking', 'ignition', 'expectedAnnualLoss'] as const) {
        for (const q of ['p05', 'p50', 'p95'] as const) expect(bands[m][q] / (central[t]![m] * factor[q])).toBeCloseTo(1, 9) // exact up to rounding
      }
    })
    // the flash-density factor explains all the variance: its total effect is 1 within its sampling error
    const st = s.sensitivity[0]!.indices[0]!.totalEffect
    expect(Math.abs(st.estimate - 1)).toBeLessThanOrEqual(3 * st.se)
  })

  it('sharp threshold, only U50 uncertain: the sparking band follows the closed form at the drawn U50 quantiles', () => {
    // MODEL.md §6 / docs/methodology.md deterministic reference for σ → 0: f = Ng·1e-6·∫ f(i)·π(y_s(i)² − D(i)²)⁺ di,
    // y_s = Kc·i·h/U50 (as tests/unit/engine/consistency.test.ts); sparking falls with U50, so the band's 5 % point
    // is the closed form at the drawn U50's 95 % point.
    const base = { thresholds: { sharp_device: { u50Kv: 70, sigma: 0 } } }
    const set = parseAssumptions({ ...base, uncertainty: { entries: [lognormal('thresholds.sharp_device.u50Kv', 70, 0.25)], correlations: [] } })
    const tank = makeTank({ heightM: 10, diameterM: 4, components: [{ componentClass: 'sharp_device', count: 1, heightM: 8 }] })
    const closedForm = (u50: number) => {
      const kc = ruskCoupling(1.2e8)
      // the law truncated to [Imin, Imax] = [2, 400] kA and renormalised (MODEL.md §1)
      const F = (i: number) => 1 - 1 / (1 + Math.pow(i / 31, 2.6))
      const mass = F(400) - F(2)
      const n = 20_000
      const lo = Math.log(2)
      const h = (Math.log(400) - lo) / n
      let sum = 0
      for (let k = 0; k <= n; k++) {
        const i = Math.exp(lo + k * h)
        const x = Math.pow(i / 31, 2.6)
        const ys = kc * i * 8 / u50
        const d = lateralAttractionDistance(i, 10, 2, set)
        sum += (k === 0 || k === n ? 1 : k % 2 === 1 ? 4 : 2) * (2.6 * x / (1 + x) ** 2) * Math.PI * Math.max(0, ys * ys - d * d)
      }
      return 4e-6 * sum * h / 3 / mass
    }
    const plan = planAssumptionDraws(set, { draws: 100, runSeed: 8 })
    const site = makeSite([tank])
    const v = siteDrawValues(site, plan, { runSeed: 8, samples: 30_000 })
    const central = [{ direct: 0, sparking: closedForm(70), ignition: 0, expectedAnnualLoss: 0 }]
    const s = summariseSiteDraws(v, central, plan, 8)
    const u50 = bandOf(plan.valuesA[0]!)
    // Tolerance 5 %: the common-random-number ratio's sampling error at ±1.6 σ of U50, measured at
    // 1–3 % with 20 000 shared flashes (from the estimator; quantiles of a monotone figure commute
    // with it, up to the interpolation between neighbouring draws).
    expect(Math.abs(s.tanks[0]!.sparking.p05 / closedForm(u50.p95) - 1)).toBeLessThan(0.05)
    expect(Math.abs(s.tanks[0]!.sparking.p50 / closedForm(u50.p50) - 1)).toBeLessThan(0.05)
    expect(Math.abs(s.tanks[0]!.sparking.p95 / closedForm(u50.p05) - 1)).toBeLessThan(0.05)
    // and the band is wide: U50's 5–95 % range moves the figure by far more than the tolerance
    expect(s.tanks[0]!.sparking.p95 / s.tanks[0]!.sparking.p05).toBeGreaterThan(1.5)
  })

  it('a drawn current law re-weights the shared currents: ratios follow the deterministic quadrature', () => {
    // importance re-weighting by the likelihood ratio of the truncated densities (common practice);
    // reference: isolatedTankQuadrature (MODEL.md §6) at each drawn median current
    const set = parseAssumptions({ uncertainty: { entries: [lognormal('powerLawMedianKa', 31, 0.2)], correlations: [] } })
    const tank = makeTank()
    const plan = planAssumptionDraws(set, { draws: 50, runSeed: 12 })
    const v = siteDrawValues(makeSite([tank]), plan, { runSeed: 12, samples: 30_000 })
    const q0 = isolatedTankQuadrature(tank, 4, set)
    for (const k of [1, 2, 3, 4, 5]) {
      const drawn = plan.a[k - 1]!.assumptions
      const qk = isolatedTankQuadrature(tank, 4, drawn)
      // tolerance 4 %: the ratio's sampling error at 30 000 shared flashes (from the estimator)
      expect(Math.abs((v.values[k * 4]! / v.values[0]!) / (qk.directPerYear / q0.directPerYear) - 1)).toBeLessThan(0.04)
      expect(Math.abs((v.values[k * 4 + 1]! / v.values[1]!) / (qk.sparkingPerYear / q0.sparkingPerYear) - 1)).toBeLessThan(0.04)
    }
  })

  it('the site series is the sum of its tanks\' adjusted figures, evaluation by evaluation; at the central set it is the central figure', () => {
    const set = parseAssumptions({ uncertainty: { entries: [lognormal('thresholds.grounded_pipe.u50Kv', 100, 0.2), { path: 'ignitionGivenSpark.crude', distribution: { kind: 'normal', mean: 0.3, sd: 0.06 }, basis: 'analyst', note: '' }], correlations: [] } })
    const plan = planAssumptionDraws(set, { draws: 50, runSeed: 13 })
    const site = battery()
    const v = siteDrawValues(site, plan, { runSeed: 13, samples: 1500 })
    const central = site.tanks.map((_, t) => ({ direct: 1e-4 * (t + 1), sparking: 0.1 * (t + 1), ignition: 0.03 * (t + 1), expectedAnnualLoss: 500 * (t + 1) }))
    const s = summariseSiteDraws(v, central, plan, 13)
    // evaluation 0 is the central set: central × X_0 / X_0 (common practice: the ratio anchors the band on the run's own figure)
    expect(s.series.ignition[0]! / central.reduce((n, c) => n + c.ignition, 0)).toBeCloseTo(1, 12)
    // crude ignition is drawn: tank B (crude) moves, and so does the site's band
    expect(s.tanks[1]!.ignition.p95).toBeGreaterThan(s.tanks[1]!.ignition.p05)
    expect(s.sensitivity.map((r) => r.indices.length)).toEqual([2, 2])
  })

  it('the plan\'s design (A and B among the band draws, A_B^g) estimates the indices of an additive model within 3 bootstrap standard errors', () => {
    // Y = ln f + 2 ln U50 with ln f ~ N(0, 0.3²) and ln U50 ~ N(ln 100, 0.2²) independent: an additive
    // model, S_i = ST_i = V_i / V (closed form; Saltelli et al. 2008, "Global Sensitivity Analysis.
    // The Primer", §1.2): V_f = 0.09, V_U = 4 × 0.04 = 0.16, so S_f = 0.36 and S_U = 0.64.
    const set = parseAssumptions({ uncertainty: { entries: [lognormal('flashDensityFactor', 1, 0.3), lognormal('thresholds.grounded_pipe.u50Kv', 100, 0.2)], correlations: [] } })
    const plan = planAssumptionDraws(set, { draws: 500, runSeed: 31 })
    const series = Float64Array.from(planEvaluations(plan), (d) => Math.log(d.flashDensityFactor) + 2 * Math.log(d.assumptions.thresholds.grounded_pipe.u50Kv))
    const r = sensitivityOf(series, plan, 'aal', 31)
    expect(r.baseSamples).toBe(250)
    const expected: Record<string, number> = { flashDensityFactor: 0.36, 'thresholds.grounded_pipe.u50Kv': 0.64 }
    for (const i of r.indices) {
      expect(Math.abs(i.firstOrder.estimate - expected[i.path]!)).toBeLessThanOrEqual(3 * i.firstOrder.se)
      expect(Math.abs(i.totalEffect.estimate - expected[i.path]!)).toBeLessThanOrEqual(3 * i.totalEffect.se)
      expect(i.firstOrder.se).toBeLessThan(0.1)
    }
  })

  it('an A_B^g evaluation moves only the figures its factor acts on (the sums shared across evaluations are the right ones)', () => {
    // Each factor's effect by the model's structure (MODEL.md: rate = Ng × flash sums; loss = fires ×
    // expected loss of a burning tank): the flash-density factor scales every figure, the damage ratios
    // only the loss, ignition given a spark the ignition and the loss but not strikes or sparking, fire
    // spread only the loss, the sparking level sparking, ignition and loss.
    const set = parseAssumptions({ uncertainty: { entries: [
      lognormal('flashDensityFactor', 1, 0.3),
      { path: 'ignitionGivenSpark.crude', distribution: { kind: 'uniform', min: 0.1, max: 0.5 }, basis: 'analyst', note: '' },
      { path: 'damageRatio.replacement.mean', distribution: { kind: 'uniform', min: 0.4, max: 0.9 }, basis: 'analyst', note: '' },
      { path: 'fireSpread.probabilityAtContact', distribution: { kind: 'uniform', min: 0.1, max: 0.5 }, basis: 'analyst', note: '' },
      lognormal('thresholds.grounded_pipe.u50Kv', 100, 0.3),
    ], correlations: [] } })
    const site = battery({ tanks: battery().tanks.map((t) => ({ ...t, contents: 'crude' as const })) })
    const plan = planAssumptionDraws(set, { draws: 50, runSeed: 21 })
    const v = siteDrawValues(site, plan, { runSeed: 21, samples: 2000 })
    const nT = site.tanks.length
    const at = (e: number, t: number, m: number) => v.values[(e * nT + t) * 4 + m]!
    const factorOf = (p: string) => plan.factors.findIndex((f) => f.path === p)
    const offsets = (g: number) => 1 + plan.draws + g * plan.baseSamples
    const rel = (x: number, y: number) => Math.abs(x - y) / Math.max(Math.abs(y), 1e-300)
    const moved = { ignition: 0, spread: 0, sparking: 0 }
    for (let j = 0; j < plan.baseSamples; j++) {
      const A = 1 + j
      for (let t = 0; t < nT; t++) {
        // flash density: every figure × f_B / f_A
        const fd = offsets(factorOf('flashDensityFactor')) + j
        const ratio = plan.ab[factorOf('flashDensityFactor')]![j]!.flashDensityFactor / plan.a[j]!.flashDensityFactor
        for (let m = 0; m < 4; m++) expect(rel(at(fd, t, m), at(A, t, m) * ratio)).toBeLessThan(1e-12)
        // damage: strikes, sparking and ignition as A; the loss as the expected loss of a burning tank
        const dm = offsets(factorOf('damageRatio.replacement.mean')) + j
        for (let m = 0; m < 3; m++) expect(at(dm, t, m)).toBe(at(A, t, m))
        const lossRatio = expectedBurningTankLoss(site.tanks[t]!, plan.ab[factorOf('damageRatio.replacement.mean')]![j]!.assumptions).total / expectedBurningTankLoss(site.tanks[t]!, plan.a[j]!.assumptions).total
        expect(rel(at(dm, t, 3), at(A, t, 3) * lossRatio)).toBeLessThan(1e-12)
        // ignition: strikes and sparking as A; ignition moves (tanks that can spark)
        const ig = offsets(factorOf('ignitionGivenSpark.crude')) + j
        for (let m = 0; m < 2; m++) expect(at(ig, t, m)).toBe(at(A, t, m))
        if (at(A, t, 1) > 0 && at(ig, t, 2) !== at(A, t, 2)) moved.ignition++
        // fire spread: strikes, sparking and ignition as A; only the loss moves
        const sp = offsets(factorOf('fireSpread.probabilityAtContact')) + j
        for (let m = 0; m < 3; m++) expect(at(sp, t, m)).toBe(at(A, t, m))
        if (at(sp, t, 3) !== at(A, t, 3)) moved.spread++
        // sparking level: direct strikes as A; sparking moves
        const th = offsets(factorOf('thresholds.grounded_pipe.u50Kv')) + j
        expect(at(th, t, 0)).toBe(at(A, t, 0))
        if (at(th, t, 1) !== at(A, t, 1)) moved.sparking++
      }
    }
    expect(moved.ignition).toBeGreaterThan(0)
    expect(moved.spread).toBeGreaterThan(0)
    expect(moved.sparking).toBeGreaterThan(0)
  })

  it('same inputs and seed → same values, whatever other sites are computed (chunks and workers)', () => {
    const set = parseAssumptions({ uncertainty: { entries: [lognormal('thresholds.sharp_device.u50Kv', 70, 0.2), lognormal('powerLawMedianKa', 31, 0.1)], correlations: [] } })
    const one = siteDrawValues(battery(), planAssumptionDraws(set, { draws: 50, runSeed: 9 }), { runSeed: 9, samples: 1000 })
    siteDrawValues(makeSite([makeTank({ id: 'other' })], [], { id: 'other-site' }), planAssumptionDraws(set, { draws: 50, runSeed: 9 }), { runSeed: 9, samples: 1000 })
    const two = siteDrawValues(battery(), planAssumptionDraws(set, { draws: 50, runSeed: 9 }), { runSeed: 9, samples: 1000 })
    expect(Array.from(two.values)).toEqual(Array.from(one.values))
    expect(drawsOf(two.values, 50).length).toBe(50)
  })
})
