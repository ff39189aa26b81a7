// After the storm: per-flash, per-tank probabilities through the runs' kernel, against closed forms
// (electrogeometric attraction distance, Rusk's formula with the log-normal sparking threshold) and
// an independent brute-force 2-D quadrature over the location error. Each expected value names its
// source beside it.
import { describe, expect, it } from 'vitest'
import jStat from 'jstat'
import {
  atLeastOnce, eastNorthOf, evaluateFlashes, flashTankProbabilities, lateralAttractionDistance, parseAssumptions, prepareSite,
  stormReachM, stormSiteOutcome, type PreparedSite,
} from '../../shared/engine/index'
import { battery, makeSite, makeTank } from '../unit/engine/fixtures'

const a = parseAssumptions({})
const egm = { strikingDistanceA: 10, strikingDistanceB: 0.65, groundStrikingFactor: 1 } // MODEL.md §2 defaults
// Rusk's coupling at v = 1.2·10⁸ m/s: Z0·(1 + β/(√2·sqrt(1 − β²/2))), Z0 = 30 Ω (Rusk; IEEE Std 1410)
const beta = 1.2e8 / 299_792_458
const KC = 30 * (1 + beta / Math.SQRT2 / Math.sqrt(1 - beta * beta / 2))
const sharp = a.thresholds.sharp_device // U50 70 kV, σ 0.3 (MODEL.md §4 illustrative defaults)

/** Closed form: Φ(ln(Kc·I·h/(max(y, floor)·U50))/σ) for one component (Rusk, MODEL.md §3–4), jstat's Φ. */
function ruskSpark(currentKa: number, partHeightM: number, distanceM: number, floorM: number): number {
  const v = KC * currentKa * partHeightM / Math.max(distanceM, floorM)
  return jStat.normal.cdf(Math.log(v / sharp.u50Kv) / sharp.sigma, 0, 1)
}

/**
 * Brute-force 2-D quadrature over a circular normal error N(μ, σ²I), independent of the engine's
 * polar rule: a square grid of `h`-metre cells over μ ± 6σ, each cell weighted by its exact mass
 * (differences of jstat's normal CDF per axis), the integrand evaluated at the cell centre.
 */
function bruteForce(mx: number, my: number, sigma: number, h: number, integrand: (x: number, y: number) => number[]): number[] {
  const n = Math.ceil(12 * sigma / h)
  const edges = Array.from({ length: n + 1 }, (_, i) => -6 * sigma + i * h)
  const mass = edges.slice(1).map((e, i) => jStat.normal.cdf(e, 0, sigma) - jStat.normal.cdf(edges[i]!, 0, sigma))
  let sums: number[] | null = null
  for (let i = 0; i < n; i++) {
    const x = mx + edges[i]! + h / 2
    for (let j = 0; j < n; j++) {
      const w = mass[i]! * mass[j]!
      if (w < 1e-14) continue
      const v = integrand(x, my + edges[j]! + h / 2)
      sums ??= v.map(() => 0)
      for (let k = 0; k < v.length; k++) sums[k]! += w * v[k]!
    }
  }
  return sums ?? []
}

// The stated tolerance for the default 48 × 48 grid: half a percentage point (0.005), the resolution
// at which the storm report shows probabilities; a 512 × 512 grid must be within 0.001 (the midpoint
// rule's error falls about as 1/N). Both are requirements, not fits to the result.
const DEFAULT_TOLERANCE = 0.005
const FINE_TOLERANCE = 0.001

describe('one flash, one isolated tank, exact location', () => {
  const tank = makeTank() // H 10 m, radius 2 m, one sharp device 8 m high, condensate, FRP
  const ps = prepareSite(makeSite([tank]), a)

  it('on the axis with a large current: direct strike with probability 1', () => {
    const p = flashTankProbabilities(ps, { eastM: 0, northM: 0, currentKa: 100, sigmaM: 0 })
    expect(p.direct[0]).toBe(1) // MODEL.md §2: on the axis, capture height H + rs > rg = rs
    expect(p.sparking[0]).toBe(0) // a direct strike is counted as such, not as induced sparking (MODEL.md §4)
    expect(p.ignition[0]).toBeCloseTo(0.5, 12) // MODEL.md §4: ignition given a direct strike, non-conducting tank 0.5
  })

  it('just outside the attraction distance: no direct strike, sparking by Rusk and the threshold', () => {
    const current = 30
    const d = lateralAttractionDistance(current, 10, 2, egm) // closed form a + sqrt(rs² − (rg − H)²), MODEL.md §2
    expect(d).toBeCloseTo(2 + Math.sqrt((10 * 30 ** 0.65) ** 2 - (10 * 30 ** 0.65 - 10) ** 2), 9) // hand-worked: 43.53 m
    const y = d + 5
    const p = flashTankProbabilities(ps, { eastM: y, northM: 0, currentKa: current, sigmaM: 0 })
    expect(p.direct[0]).toBe(0) // outside D(I) the ground captures (MODEL.md §2)
    const expected = ruskSpark(current, 8, y, 8) // Rusk + log-normal threshold, closed form
    expect(p.sparking[0]).toBeCloseTo(expected, 6) // kernel tables: cubic Hermite error < 1e-6 (kernel.ts)
    expect(p.ignition[0]).toBeCloseTo(expected * 0.4, 6) // MODEL.md §4: ignition given a spark, condensate 0.4
  })

  it('far or weak flashes are negligible', () => {
    const far = flashTankProbabilities(ps, { eastM: 5000, northM: 0, currentKa: 30, sigmaM: 200 })
    // Rusk at 5 km even 6σ nearer (3.8 km): V = 38.85·30·8/3800 = 2.45 kV, z = ln(2.45/70)/0.3 = −11.2 → Φ < 1e-28
    expect(far.ignition[0]).toBeLessThan(1e-12)
    const weak = flashTankProbabilities(ps, { eastM: 300, northM: 0, currentKa: 3, sigmaM: 0 })
    // Rusk: V = 38.85·3·8/300 = 3.1 kV, z = ln(3.1/70)/0.3 = −10.4 → Φ ≈ 1e-25 (closed form)
    expect(weak.sparking[0]).toBeLessThan(1e-12)
    expect(weak.direct[0]).toBe(0)
    // Beyond the reach (relevant radius + 11.3σ) nothing is evaluated: exactly 0.
    const beyond = flashTankProbabilities(ps, { eastM: stormReachM(ps, 30, 200) + 1, northM: 0, currentKa: 30, sigmaM: 200 })
    expect(beyond.direct[0]! + beyond.sparking[0]!).toBe(0)
  })
})

describe('with location error: equal to a brute-force quadrature', () => {
  const tank = makeTank()
  const ps = prepareSite(makeSite([tank]), a)
  const current = 30
  const d = lateralAttractionDistance(current, 10, 2, egm)
  // Closed-form integrand (independent of the kernel): direct inside D(I), else Rusk with the floor max(h, a) = 8 m.
  const reference = bruteForce(120, 0, 100, 1, (x, y) => {
    const r = Math.hypot(x, y)
    return r < d ? [1, 0] : [0, ruskSpark(current, 8, r, 8)]
  })

  it('default grid within the stated tolerance', () => {
    const p = flashTankProbabilities(ps, { eastM: 120, northM: 0, currentKa: current, sigmaM: 100 })
    expect(Math.abs(p.direct[0]! - reference[0]!)).toBeLessThan(DEFAULT_TOLERANCE) // brute-force quadrature
    expect(Math.abs(p.sparking[0]! - reference[1]!)).toBeLessThan(DEFAULT_TOLERANCE) // brute-force quadrature
    expect(Math.abs(p.ignition[0]! - (0.5 * reference[0]! + 0.4 * reference[1]!))).toBeLessThan(DEFAULT_TOLERANCE) // MODEL.md §4 factors
  })

  it('a fine grid converges to it', () => {
    const p = flashTankProbabilities(ps, { eastM: 120, northM: 0, currentKa: current, sigmaM: 100 }, { rings: 512, spokes: 512 })
    expect(Math.abs(p.direct[0]! - reference[0]!)).toBeLessThan(FINE_TOLERANCE) // brute-force quadrature
    expect(Math.abs(p.sparking[0]! - reference[1]!)).toBeLessThan(FINE_TOLERANCE) // brute-force quadrature
  })
})

/** The runs' kernel at one exact point: per tank [direct, sparking] (evaluateFlashes, as a run calls it). */
function runKernelAt(ps: PreparedSite, x: number, y: number, current: number): number[] {
  const out = new Float64Array(2 * ps.nTanks)
  evaluateFlashes(ps, Float64Array.of(x - ps.centreX), Float64Array.of(y - ps.centreY), Float64Array.of(current), out, new Float64Array(ps.nTanks))
  return Array.from({ length: ps.nTanks }, (_, t) => [out[ps.nTanks + t]!, out[t]!]).flat()
}

describe('a mast beside the tank changes the result as in runs', () => {
  const site = battery() // tanks A (0,0) H 7, B (10,0) H 9, C (20,0) H 6; mast (10,14) H 25
  const withMast = prepareSite(site, a)
  const withoutMast = prepareSite({ ...site, structures: [] }, a)

  it('a flash on a tank’s axis goes to the mast beside it', () => {
    const tankA = site.tanks[0]!
    const alone = flashTankProbabilities(prepareSite(makeSite([tankA]), a), { eastM: 0, northM: 0, currentKa: 20, sigmaM: 0 })
    expect(alone.direct[0]).toBe(1) // MODEL.md §2: A's capture height 7 + rs beats the ground
    const shielded = flashTankProbabilities(prepareSite(makeSite([tankA], site.structures), a), { eastM: 0, northM: 0, currentKa: 20, sigmaM: 0 })
    // Hand-worked EGM: rs = 10·20^0.65 = 70.2 m; A: 7 + 70.2 = 77.2 m; mast at 17.2 m (edge 16.9 m):
    // 25 + sqrt(70.2² − 16.9²) = 93.1 m — the mast captures.
    expect(shielded.direct[0]).toBe(0)
    const y = Math.hypot(10, 14) // the flash attaches at the mast's axis, 17.2 m from A
    expect(shielded.sparking[0]).toBeCloseTo(ruskSpark(20, 8, y, 8), 6) // Rusk + threshold, closed form
  })

  it('exact locations give what the runs’ kernel gives', () => {
    for (const [x, y, i] of [[0, 0, 20], [10, 14, 35], [-30, 5, 60], [15, -40, 12]] as const) {
      const p = flashTankProbabilities(withMast, { eastM: x, northM: y, currentKa: i, sigmaM: 0 })
      const k = runKernelAt(withMast, x, y, i)
      for (let t = 0; t < 3; t++) {
        expect(p.direct[t]).toBeCloseTo(k[2 * t]!, 12) // evaluateFlashes (the runs' kernel)
        expect(p.sparking[t]).toBeCloseTo(k[2 * t + 1]!, 12) // evaluateFlashes (the runs' kernel)
      }
    }
  })

  it('with location error, equal to a brute-force quadrature of the runs’ kernel', () => {
    const flash = { eastM: 20, northM: -30, currentKa: 40, sigmaM: 40 }
    const reference = bruteForce(flash.eastM, flash.northM, flash.sigmaM, 0.5, (x, y) => runKernelAt(withMast, x, y, flash.currentKa))
    const p = flashTankProbabilities(withMast, flash)
    for (let t = 0; t < 3; t++) {
      expect(Math.abs(p.direct[t]! - reference[2 * t]!)).toBeLessThan(DEFAULT_TOLERANCE) // brute-force quadrature
      expect(Math.abs(p.sparking[t]! - reference[2 * t + 1]!)).toBeLessThan(DEFAULT_TOLERANCE) // brute-force quadrature
    }
    const bare = flashTankProbabilities(withoutMast, flash)
    expect(Math.abs(bare.direct[0]! - p.direct[0]!) + Math.abs(bare.sparking[0]! - p.sparking[0]!)).toBeGreaterThan(DEFAULT_TOLERANCE) // the mast matters here (hand-worked: it shields A and B)
  })
})

describe('flashes of one storm combine per tank', () => {
  const ps = prepareSite(makeSite([makeTank()]), a)
  it('P(at least one ignition) = 1 − Π(1 − p_f); the driving flash is the largest', () => {
    const flashes = [
      { eastM: 80, northM: 0, currentKa: 25, sigmaM: 0 },
      { eastM: 60, northM: 30, currentKa: 45, sigmaM: 50 },
    ]
    const single = flashes.map(f => flashTankProbabilities(ps, f).ignition[0]!)
    const [outcome] = stormSiteOutcome(ps, flashes)
    expect(outcome!.ignition).toBeCloseTo(1 - (1 - single[0]!) * (1 - single[1]!), 14) // independent flashes, hand-worked
    expect(atLeastOnce(single)).toBeCloseTo(outcome!.ignition, 14) // same rule
    expect(outcome!.drivingFlash).toBe(single[0]! > single[1]! ? 0 : 1) // definition
  })
})

describe('site frame', () => {
  it('east/north metres of a recorded point', () => {
    const p = eastNorthOf(30, -95, 30.001, -95)
    expect(p.northM).toBeCloseTo(111.195, 2) // 6371.0088 km · 0.001° · π/180 = 111.195 m (arc length)
    expect(p.eastM).toBe(0)
    const q = eastNorthOf(60, 10, 60, 10.002)
    expect(q.eastM).toBeCloseTo(111.195, 2) // 0.002° of longitude at 60° N: ·cos 60° = 111.195 m (arc length)
  })
})
