// After the storm, in money: a site's loss from one storm window as one occurrence
// (shared/storms/loss.ts), against a brute force written here apart from the code under test
// (the 2³ ignition subsets enumerated by hand, composite Gauss–Legendre over each tank's damage
// with jstat's beta quantiles), closed forms (degenerate damage ratios; the beta stop-loss
// transform) and the cap at what is at risk. Each expected value names its source beside it.
import { describe, expect, it } from 'vitest'
import jStat from 'jstat'
import { stormSiteLoss, stormSiteLossModel, burningSetProbabilities, levelTables, STORM_EXACT_MAX_TANKS, type StormSiteLossModel } from '../../shared/storms/loss'
import type { SiteTerms } from '../../shared/insurance/terms'
import { burningTankLoss, parseAssumptions, prepareSite } from '../../shared/engine/index'
import { makeSite, makeTank } from '../unit/engine/fixtures'

type Ratio = { mean: number, sd: number }
type Components = { replacement: number, contents: number, cleanup: number, interruption: number }
const DEFAULT_RATIOS = { replacement: { mean: 0.7, sd: 0.25 }, contents: { mean: 0.8, sd: 0.25 }, cleanup: { mean: 0.6, sd: 0.3 }, interruption: { mean: 0.6, sd: 0.3 } } // the documented defaults (README "Loss model")
const SEED = { window: 'test-window', site: 'test-site' }
const terms = (t: Partial<SiteTerms>): SiteTerms => ({ occurrenceDeductible: 0, occurrenceLimit: null, aggregateDeductible: 0, aggregateLimit: null, interruptionDeductible: 0, share: 1, ...t })
const total = (v: Components) => v.replacement + v.contents + v.cleanup + v.interruption

function model(tanks: { ignition: number, values: Components }[], ratios: Record<keyof Components, Ratio> = DEFAULT_RATIOS, spread: [number, number, number][] = []): StormSiteLossModel {
  return { version: 1, tanks: tanks.map((t, i) => ({ tankId: `t${i}`, ...t })), spread, damageRatio: ratios, valueAtRisk: tanks.reduce((s, t) => s + total(t.values), 0) }
}

// ---- The brute force, independent of shared/storms/loss.ts --------------------------------------

/** Gauss–Legendre nodes and weights on [−1, 1] (Newton on P_n; Abramowitz & Stegun 25.4.29). */
function gaussLegendre(n: number): { x: number[], w: number[] } {
  const x: number[] = [], w: number[] = []
  const legendre = (z: number) => {
    let p0 = 1, p1 = z
    for (let k = 2; k <= n; k++) { const p2 = ((2 * k - 1) * z * p1 - (k - 1) * p0) / k; p0 = p1; p1 = p2 }
    return { p: p1, dp: n * (z * p1 - p0) / (z * z - 1) }
  }
  for (let i = 1; i <= n; i++) {
    let z = Math.cos(Math.PI * (i - 0.25) / (n + 0.5))
    for (let it = 0; it < 100; it++) { const { p, dp } = legendre(z); const dz = p / dp; z -= dz; if (Math.abs(dz) < 1e-15) break }
    const { dp } = legendre(z)
    x.push(z)
    w.push(2 / ((1 - z * z) * dp * dp))
  }
  return { x, w }
}

/** The damage ratio at level u: jstat's beta quantile (method-of-moments shape), or the mean when sd = 0. */
function betaQuantile(r: Ratio, u: number): number {
  if (r.sd === 0) return r.mean
  const k = r.mean * (1 - r.mean) / (r.sd * r.sd) - 1
  return jStat.beta.inv(u, r.mean * k, (1 - r.mean) * k)
}

/** The occurrence terms written out again: PD − d, BI − d_BI, floored at 0, their sum capped, × share. */
const occurrence = (pd: number, bi: number, t: SiteTerms) => Math.min(Math.max(0, pd - t.occurrenceDeductible) + Math.max(0, bi - t.interruptionDeductible), t.occurrenceLimit ?? Infinity) * t.share

/**
 * E[terms(Σ PD, Σ BI)] for independent ignitions without spread: the 2ⁿ subsets one by one, and for
 * each a tensor composite Gauss–Legendre rule (panels × 4 points per tank) over the tanks' uniforms,
 * one uniform driving every component of a tank (comonotone, MODEL.md §4).
 */
function bruteForce(tanks: { ignition: number, values: Components }[], ratios: Record<keyof Components, Ratio>, t: SiteTerms, panels = 40): number {
  const g = gaussLegendre(4)
  const us: number[] = [], ws: number[] = []
  for (let p = 0; p < panels; p++) for (let k = 0; k < 4; k++) { us.push((p + (g.x[k]! + 1) / 2) / panels); ws.push(g.w[k]! / 2 / panels) }
  const table = tanks.map(tank => us.map(u => ({
    pd: tank.values.replacement * betaQuantile(ratios.replacement, u) + tank.values.contents * betaQuantile(ratios.contents, u) + tank.values.cleanup * betaQuantile(ratios.cleanup, u),
    bi: tank.values.interruption * betaQuantile(ratios.interruption, u),
  })))
  let expected = 0
  for (let subset = 1; subset < 1 << tanks.length; subset++) {
    let p = 1
    const burning: number[] = []
    tanks.forEach((tank, i) => { if (subset & (1 << i)) { p *= tank.ignition; burning.push(i) } else p *= 1 - tank.ignition })
    let e = 0
    const integrate = (level: number, pd: number, bi: number, weight: number) => {
      if (level === burning.length) { e += weight * occurrence(pd, bi, t); return }
      const rows = table[burning[level]!]!
      for (let k = 0; k < us.length; k++) integrate(level + 1, pd + rows[k]!.pd, bi + rows[k]!.bi, weight * ws[k]!)
    }
    integrate(0, 0, 0, 1)
    expected += p * e
  }
  return expected
}

// ---- Tests ---------------------------------------------------------------------------------------

describe('the insured loss of one storm at one site', () => {
  // Invented test inputs: three tanks of different sizes and P(fire).
  const three = [
    { ignition: 0.5, values: { replacement: 200_000, contents: 100_000, cleanup: 50_000, interruption: 80_000 } },
    { ignition: 0.2, values: { replacement: 150_000, contents: 60_000, cleanup: 40_000, interruption: 30_000 } },
    { ignition: 0.05, values: { replacement: 300_000, contents: 200_000, cleanup: 80_000, interruption: 120_000 } },
  ]

  it('three tanks: equals a brute force over the 8 ignition subsets and the beta damage ratios within 1e-4 relative', () => {
    const t = terms({ occurrenceDeductible: 250_000, interruptionDeductible: 20_000, occurrenceLimit: 600_000, share: 0.6 })
    const got = stormSiteLoss(model(three), t, SEED)
    expect(got.insured!.method).toBe('exact')
    const reference = bruteForce(three, DEFAULT_RATIOS, t) // brute force above, 160 Gauss–Legendre nodes per tank
    expect(reference).toBeGreaterThan(10_000)
    // Tolerance: the code’s midpoint rule (40 nodes per tank for three burning tanks, 256 for two) and its tabulated
    // beta quantile (error below 1e-4 of a value, loss.ts) against the 160-node rule with exact quantiles.
    expect(Math.abs(got.insured!.mean - reference) / reference).toBeLessThan(1e-4)
  })

  it('three tanks without terms on the distribution: ground-up is Σ P(fire) × E[loss] (linearity, closed form)', () => {
    const got = stormSiteLoss(model(three), terms({}), SEED)
    const expected = three.reduce((s, x) => s + x.ignition * (0.7 * x.values.replacement + 0.8 * x.values.contents + 0.6 * x.values.cleanup + 0.6 * x.values.interruption), 0) // mean damage ratios (README "Loss model")
    expect(got.groundUp.total).toBeCloseTo(expected, 6)
    expect(got.insured!.method).toBe('closed-form')
    expect(got.insured!.mean).toBeCloseTo(expected, 6) // no deductible, no limit, share 1: insured = ground-up
    expect(got.probabilityOfFire).toBeCloseTo(1 - 0.5 * 0.8 * 0.95, 12) // 1 − Π(1 − p), hand-worked: 0.62
  })

  it('degenerate damage ratios (sd 0) with spread: the closed form over the burning sets', () => {
    const fixed = { replacement: { mean: 0.5, sd: 0 }, contents: { mean: 1, sd: 0 }, cleanup: { mean: 1, sd: 0 }, interruption: { mean: 0.5, sd: 0 } }
    // Tank 0 (P(fire) 0.4): PD 0.5·100,000 + 20,000 + 10,000 = 80,000, BI 0.5·40,000 = 20,000. Tank 1 (P(fire) 0.1): PD 0.5·60,000 = 30,000, BI 0.
    // A fire the flashes start at tank 0 spreads to tank 1 with 0.25 (and not back).
    const tanks = [
      { ignition: 0.4, values: { replacement: 100_000, contents: 20_000, cleanup: 10_000, interruption: 40_000 } },
      { ignition: 0.1, values: { replacement: 60_000, contents: 0, cleanup: 0, interruption: 0 } },
    ]
    const m = model(tanks, fixed, [[0, 1, 0.25]])
    // Hand-worked burning sets: {0} = 0.4·0.9·0.75 = 0.27; {1} = 0.6·0.1 = 0.06; {0,1} = 0.4·0.1 + 0.4·0.9·0.25 = 0.13.
    const sets = burningSetProbabilities(m)
    expect(sets[0b01]).toBeCloseTo(0.27, 12)
    expect(sets[0b10]).toBeCloseTo(0.06, 12)
    expect(sets[0b11]).toBeCloseTo(0.13, 12)
    const t = terms({ occurrenceDeductible: 50_000, interruptionDeductible: 5_000, occurrenceLimit: 90_000, share: 0.5 })
    // {0}: (80,000 − 50,000) + (20,000 − 5,000) = 45,000; {1}: (30,000 − 50,000)+ = 0; {0,1}: min(60,000 + 15,000, 90,000) = 75,000.
    // E = 0.27·45,000 + 0.13·75,000 = 21,900; × share 0.5 = 10,950 (hand-worked).
    const got = stormSiteLoss(m, t, SEED)
    expect(got.insured!.method).toBe('exact')
    expect(got.insured!.mean).toBeCloseTo(10_950, 6)
    // Ground-up: P(0 burns) 0.4 × 100,000 + P(1 burns) (1 − 0.9·(1 − 0.4·0.25) = 0.19) × 30,000 = 45,700 (hand-worked).
    expect(got.groundUp.total).toBeCloseTo(45_700, 6)
    expect(got.tanks[1]!.burning).toBeCloseTo(0.19, 12)
  })

  it('a deductible above the mean fire loss: the old (E[X] − d)+ gave 0, the expectation does not (beta stop-loss, closed form)', () => {
    // One tank, replacement value only, damage ratio Beta with mean 0.3, sd 0.2; deductible 50,000 on a 100,000 tank.
    const r = { mean: 0.3, sd: 0.2 }
    const ratios = { replacement: r, contents: { mean: 0.5, sd: 0 }, cleanup: { mean: 0.5, sd: 0 }, interruption: { mean: 0.5, sd: 0 } }
    const tank = { ignition: 0.4, values: { replacement: 100_000, contents: 0, cleanup: 0, interruption: 0 } }
    const t = terms({ occurrenceDeductible: 50_000 })
    const old = tank.ignition * Math.max(0, r.mean * 100_000 - 50_000) // the former formula: the terms on the mean loss
    expect(old).toBe(0)
    // E[(X − c)+] = m·(1 − I_c(α + 1, β)) − c·(1 − I_c(α, β)) for X ~ Beta(α, β), c = d/V (the beta
    // stop-loss transform, from memory; jstat’s beta CDF, the regularised incomplete beta I).
    const k = r.mean * (1 - r.mean) / r.sd ** 2 - 1
    const [alpha, beta] = [r.mean * k, (1 - r.mean) * k]
    const c = 0.5
    const stopLoss = r.mean * (1 - jStat.beta.cdf(c, alpha + 1, beta)) - c * (1 - jStat.beta.cdf(c, alpha, beta))
    const expected = tank.ignition * 100_000 * stopLoss
    const got = stormSiteLoss(model([tank], ratios), t, SEED)
    expect(expected).toBeGreaterThan(500) // about 0.4 × 100,000 × 0.023
    expect(Math.abs(got.insured!.mean - expected) / expected).toBeLessThan(2e-3) // midpoint rule, 4,096 nodes, tabulated quantile
  })

  it('never above what is at risk: min(value at risk, occurrence limit) × share, however likely the fire', () => {
    const full = { replacement: { mean: 1, sd: 0 }, contents: { mean: 1, sd: 0 }, cleanup: { mean: 1, sd: 0 }, interruption: { mean: 1, sd: 0 } }
    const values = { replacement: 100_000, contents: 50_000, cleanup: 20_000, interruption: 30_000 } // 200,000 a tank
    // Six tanks (Monte Carlo path), each certain to burn with total damage: the loss is 1.2 M every draw.
    const six = model(Array.from({ length: 6 }, () => ({ ignition: 1, values })), full, [[0, 1, 1], [1, 0, 1]])
    const noLimit = stormSiteLoss(six, terms({ share: 0.8, occurrenceDeductible: 1 }), SEED)
    expect(noLimit.insured!.method).toBe('monte-carlo')
    expect(noLimit.insuredAtRisk).toBe(1_200_000 * 0.8) // Σ values × share (hand-worked)
    expect(noLimit.insured!.mean).toBeCloseTo((1_200_000 - 1) * 0.8, 4) // every draw the same: all six burn in full
    expect(noLimit.insured!.mean).toBeLessThanOrEqual(noLimit.insuredAtRisk!)
    expect(noLimit.groundUp.total).toBeCloseTo(1_200_000, 6) // each tank burns once, however many fires reach it
    const limited = stormSiteLoss(six, terms({ share: 0.8, occurrenceDeductible: 1, occurrenceLimit: 500_000 }), SEED)
    expect(limited.insured!.mean).toBeCloseTo(500_000 * 0.8, 6) // the limit binds (hand-worked)
    expect(limited.insuredAtRisk).toBe(500_000 * 0.8)
    // Exact path: a single tank certain to burn fully, under a deductible: (200,000 − 10,000) × 0.5.
    const one = stormSiteLoss(model([{ ignition: 1, values }], full), terms({ occurrenceDeductible: 10_000, share: 0.5 }), SEED)
    expect(one.insured!.mean).toBeCloseTo(95_000, 6)
  })

  it('more tanks than the exact limit: the seeded Monte Carlo agrees with the enumeration within 4 standard errors, and repeats', () => {
    // Five tanks with fixed damage (sd 0): the exact value is a plain enumeration of the 32 subsets, written here.
    const fixed = { replacement: { mean: 0.5, sd: 0 }, contents: { mean: 0.5, sd: 0 }, cleanup: { mean: 0.5, sd: 0 }, interruption: { mean: 0.5, sd: 0 } }
    const tanks = [0.3, 0.2, 0.15, 0.1, 0.05].map((ignition, i) => ({ ignition, values: { replacement: 100_000 * (i + 1), contents: 0, cleanup: 0, interruption: 20_000 } }))
    expect(tanks.length).toBeGreaterThan(STORM_EXACT_MAX_TANKS)
    const t = terms({ occurrenceDeductible: 120_000, interruptionDeductible: 15_000, occurrenceLimit: 400_000, share: 0.7 })
    let exact = 0
    for (let s = 1; s < 32; s++) {
      let p = 1, pd = 0, bi = 0
      tanks.forEach((x, i) => { if (s & (1 << i)) { p *= x.ignition; pd += 0.5 * x.values.replacement; bi += 0.5 * x.values.interruption } else p *= 1 - x.ignition })
      exact += p * occurrence(pd, bi, t)
    }
    const got = stormSiteLoss(model(tanks, fixed), t, SEED)
    expect(got.insured!.method).toBe('monte-carlo')
    expect(got.insured!.se).toBeGreaterThan(0)
    expect(Math.abs(got.insured!.mean - exact)).toBeLessThan(4 * got.insured!.se) // fails with probability 6e-5 for a sound estimator
    expect(stormSiteLoss(model(tanks, fixed), t, SEED).insured).toEqual(got.insured) // seeded: the same figure every time it is read
  })

  it('the tabulated damage levels are the runs’ own burningTankLoss at the midpoints (no second severity model)', () => {
    const m = model(three)
    const [table] = levelTables({ tanks: m.tanks.slice(0, 1), damageRatio: m.damageRatio }, 64)
    const tank = { replacementValue: 200_000, contentsValue: 100_000, cleanupCost: 50_000, interruptionCost: 80_000 }
    for (const k of [0, 7, 31, 63]) {
      const l = burningTankLoss(tank, { damageRatio: DEFAULT_RATIOS }, (k + 0.5) / 64) // shared/engine/loss.ts, as year mode draws it
      expect(table!.pd[k]).toBeCloseTo(l.propertyDamage, 6)
      expect(table!.bi[k]).toBeCloseTo(l.businessInterruption, 6)
    }
  })

  it('a site without the reader’s terms has no insured figure (not 0)', () => {
    const got = stormSiteLoss(model(three), null, SEED)
    expect(got.insured).toBeNull()
    expect(got.insuredAtRisk).toBeNull()
    expect(got.groundUp.total).toBeGreaterThan(0)
  })

  it('the model of a prepared site keeps the tanks that can burn, their spread and every tank’s value at risk', () => {
    const a = parseAssumptions({})
    // Three tanks 2 m apart shell to shell (in spread reach, 25 m) and one 200 m away (out of reach).
    const site = makeSite([
      makeTank({ id: 'a', xM: 0, yM: 0, diameterM: 10, replacementValue: 1000 }), makeTank({ id: 'b', xM: 12, yM: 0, diameterM: 10, replacementValue: 2000 }),
      makeTank({ id: 'c', xM: 24, yM: 0, diameterM: 10, replacementValue: 4000 }), makeTank({ id: 'd', xM: 200, yM: 0, diameterM: 10, replacementValue: 8000 }),
    ])
    const ps = prepareSite(site, a)
    const m = stormSiteLossModel(ps, [0.3, 0, 0, 0])
    expect(m.tanks.map(t => t.tankId)).toEqual(['a', 'b', 'c']) // a ignites; b and c are within its spread reach (2 m and 14 m)
    expect(m.spread.every(([from]) => from === 0)).toBe(true) // spread from the tank the flashes ignite only (one generation)
    const values = site.tanks.reduce((s, t) => s + t.replacementValue + t.contentsValue + t.cleanupCost + t.interruptionCost, 0)
    expect(m.valueAtRisk).toBe(values)
  })
})
