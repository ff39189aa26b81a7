// Loss given ignition: damage ratios on [0, 1], property damage and interruption apart, fire spread.
import { describe, expect, it } from 'vitest'
import jStat from 'jstat'
import { createStream, parseAssumptions, simulateSiteFrequency, simulateSiteYears, tankSeverity } from '../../../shared/engine/index'
import type { SiteInput, TankInput } from '../../../shared/engine/types'
import {
  betaShape, burningTankLoss, damageRatioQuantile, exactDamageRatioQuantile, expectedBurningTankLoss, shellDistanceM, spreadNeighbours, spreadProbability,
} from '../../../shared/engine/loss'
import { battery, makeSite, makeTank } from './fixtures'
import engine1 from './fixtures/engine-1-events.json'

const a = parseAssumptions({})

describe('damage ratio sampler', () => {
  // Moments of the beta distribution from jstat (jStat.beta.mean / variance), a general-purpose
  // reference library, against 20 000 draws by inversion of seeded uniforms.
  for (const d of [{ mean: 0.7, sd: 0.25 }, { mean: 0.2, sd: 0.15 }, { mean: 0.5, sd: 0.4 }]) {
    it(`mean ${d.mean}, sd ${d.sd}: sample moments match jstat's beta`, () => {
      const shape = betaShape(d)!
      expect(jStat.beta.mean(shape.alpha, shape.beta)).toBeCloseTo(d.mean, 12)
      expect(Math.sqrt(jStat.beta.variance(shape.alpha, shape.beta))).toBeCloseTo(d.sd, 12)
      const rand = createStream(1, 'beta', `${d.mean}/${d.sd}`)
      const n = 20_000
      let s = 0, s2 = 0
      for (let i = 0; i < n; i++) {
        const x = damageRatioQuantile(d, rand())
        expect(x).toBeGreaterThanOrEqual(0)
        expect(x).toBeLessThanOrEqual(1)
        s += x; s2 += x * x
      }
      const mean = s / n
      const sd = Math.sqrt((s2 - n * mean * mean) / (n - 1))
      // 4 standard errors of the mean (sd/√n) and of the standard deviation (≈ sd/√(2n)), common practice.
      expect(Math.abs(mean - d.mean)).toBeLessThan(4 * d.sd / Math.sqrt(n))
      expect(Math.abs(sd - d.sd)).toBeLessThan(4 * d.sd / Math.sqrt(2 * n) * 1.5)
    })
  }
  it('the quantile is jstat\'s beta quantile (median of Beta(2, 5) ≈ 0.26445, jstat and published tables)', () => {
    // Beta(2, 5): mean 2/7, sd √(10/(49·8)) — hand-worked from α/(α+β) and αβ/((α+β)²(α+β+1)).
    const d = { mean: 2 / 7, sd: Math.sqrt(10 / (49 * 8)) }
    expect(damageRatioQuantile(d, 0.5)).toBeCloseTo(0.26445, 4)
    // The tabulated quantile against jstat's exact one over the whole range (the engine's stated 1e-4).
    for (let u = 0.0005; u < 1; u += 0.0137) expect(Math.abs(damageRatioQuantile(d, u) - exactDamageRatioQuantile(d, u))).toBeLessThan(1e-4)
  })
  it('a constant ratio (sd 0, or mean 0 or 1) gives the mean at every level', () => {
    expect(damageRatioQuantile({ mean: 0.4, sd: 0 }, 0.99)).toBe(0.4)
    expect(damageRatioQuantile({ mean: 1, sd: 0 }, 0.01)).toBe(1)
    expect(damageRatioQuantile({ mean: 0, sd: 0 }, 0.5)).toBe(0)
  })
  it('refuses a spread a distribution on [0, 1] cannot have', () => {
    // sd² < m(1 − m) for any distribution on [0, 1] other than the two-point one (Bhatia–Davis inequality).
    expect(() => parseAssumptions({ damageRatio: { contents: { mean: 0.9, sd: 0.3 } } })).toThrow(/below √\(mean·\(1 − mean\)\)/)
    expect(() => parseAssumptions({ damageRatio: { contents: { mean: 1.2, sd: 0 } } })).toThrow(/probability/)
  })
  it('an assumption version stored with the retired log-normal factor still parses', () => {
    expect(parseAssumptions({ damageFactorSigma: 0.5 }).damageRatio).toEqual(a.damageRatio)
  })
})

describe('loss of a burning tank', () => {
  const tank = makeTank()
  it('each component is its value × the ratio, PD + BI = total', () => {
    const l = burningTankLoss(tank, a, 0.5)
    // Hand-worked: the fixture's values are 100 000 / 50 000 / 30 000 / 20 000.
    expect(l.replacement).toBeCloseTo(100_000 * damageRatioQuantile(a.damageRatio.replacement, 0.5), 6)
    expect(l.propertyDamage).toBeCloseTo(l.replacement + l.contents + l.cleanup, 9)
    expect(l.businessInterruption).toBe(l.interruption)
    expect(l.total).toBeCloseTo(l.propertyDamage + l.businessInterruption, 9)
  })
  it('the expected loss is value × mean ratio per component (hand-worked with the defaults)', () => {
    const e = expectedBurningTankLoss(tank, a)
    // 100 000·0.7 + 50 000·0.8 + 30 000·0.6 = 128 000 PD; 20 000·0.6 = 12 000 BI.
    expect(e.propertyDamage).toBeCloseTo(128_000, 6)
    expect(e.businessInterruption).toBeCloseTo(12_000, 6)
    expect(e.total).toBeCloseTo(140_000, 6)
  })
})

/** A random site: 1–8 tanks on a small plot with random values, some touching. */
function randomSite(rand: () => number, id: string): SiteInput {
  const n = 1 + Math.floor(rand() * 8)
  const tanks: TankInput[] = Array.from({ length: n }, (_, i) => makeTank({
    id: `${id}-t${i}`, tag: `T${i}`, xM: rand() * 40, yM: rand() * 40, heightM: 4 + rand() * 10, diameterM: 2 + rand() * 6,
    contents: (['crude', 'condensate', 'produced_water', 'fresh_water', 'chemical'] as const)[Math.floor(rand() * 5)]!,
    replacementValue: Math.round(rand() * 400_000), contentsValue: Math.round(rand() * 300_000),
    cleanupCost: Math.round(rand() * 100_000), interruptionCost: Math.round(rand() * 200_000),
  }))
  return makeSite(tanks, [], { id, flashDensity: 2 + rand() * 20 })
}

describe('property: no loss above the value at risk', () => {
  // Common practice (a property test): 300 random sites and seeds, spread at its strongest.
  const strong = parseAssumptions({ fireSpread: { probabilityAtContact: 1, decayLengthM: 20, maxDistanceM: 50 } })
  it('no tank above its value, no event above the tanks it burned, no year above its events', () => {
    const rand = createStream(7, 'property', 'sites')
    let events = 0
    for (let s = 0; s < 300; s++) {
      const site = randomSite(rand, `s${s}`)
      const r = simulateSiteYears(site, s % 2 ? strong : a, { runSeed: s, years: 150 })
      const yearSum = new Float64Array(r.years)
      for (let e = 0; e < r.events.year.length; e++) {
        events += 1
        let burnedValue = 0
        let tankSum = 0
        const seen = new Set<number>()
        for (let k = r.events.tankStart[e]!; k < r.events.tankStart[e + 1]!; k++) {
          const t = r.events.tankIndex[k]!
          expect(seen.has(t)).toBe(false) // a tank burns once per event
          seen.add(t)
          const value = tankSeverity(site.tanks[t]!)
          expect(r.events.tankLoss[k]!).toBeLessThanOrEqual(value * (1 + 1e-12))
          expect(r.events.tankPropertyDamage[k]! + r.events.tankBusinessInterruption[k]!).toBeCloseTo(r.events.tankLoss[k]!, 6)
          burnedValue += value
          tankSum += r.events.tankLoss[k]!
        }
        expect(r.events.loss[e]!).toBeLessThanOrEqual(burnedValue * (1 + 1e-12))
        expect(tankSum).toBeCloseTo(r.events.loss[e]!, 6)
        expect(r.events.propertyDamage[e]! + r.events.businessInterruption[e]!).toBeCloseTo(r.events.loss[e]!, 6)
        yearSum[r.events.year[e]!]! += r.events.loss[e]!
      }
      for (let y = 0; y < r.years; y++) {
        expect(r.yearLosses[y]!).toBeLessThanOrEqual(yearSum[y]! * (1 + 1e-12) + 1e-9)
        expect(r.propertyDamage.yearLosses[y]! + r.businessInterruption.yearLosses[y]!).toBeCloseTo(r.yearLosses[y]!, 4)
      }
    }
    expect(events).toBeGreaterThan(100) // enough events for the property to mean something
  })
})

describe('fire spread', () => {
  it('probability falls with shell-to-shell distance and stops at dmax (hand-worked)', () => {
    const s = { model: 'exponential' as const, probabilityAtContact: 0.25, decayLengthM: 5, maxDistanceM: 25 }
    expect(spreadProbability(0, s)).toBe(0.25)
    expect(spreadProbability(5, s)).toBeCloseTo(0.25 * Math.exp(-1), 12)
    expect(spreadProbability(26, s)).toBe(0)
    expect(spreadProbability(0, { ...s, model: 'off' })).toBe(0)
    // Two 4 m tanks 10 m apart (centres): 10 − 2 − 2 = 6 m shell to shell.
    expect(shellDistanceM(makeTank({ xM: 0 }), makeTank({ xM: 10 }))).toBe(6)
  })
  it('lists the neighbours a fire would most likely reach; none that cannot burn', () => {
    const site = makeSite([
      makeTank({ id: 'a', tag: 'A', xM: 0 }), makeTank({ id: 'b', tag: 'B', xM: 5 }), makeTank({ id: 'c', tag: 'C', xM: 12 }),
      makeTank({ id: 'w', tag: 'W', xM: -5, contents: 'fresh_water' }),
    ])
    const n = spreadNeighbours(site, a)
    expect(n[0]!.map(x => x.tag)).toEqual(['B', 'C'])
    expect(n[0]![0]!.distanceM).toBe(1)
    expect(n[0]!.some(x => x.tag === 'W')).toBe(false)
    expect(spreadNeighbours(site, parseAssumptions({ fireSpread: { model: 'off' } }))[0]).toEqual([])
  })

  const off = parseAssumptions({ fireSpread: { model: 'off' } })
  const close = makeSite([
    makeTank({ id: 'p', tag: 'P', xM: 0, yM: 0 }),
    makeTank({ id: 'q', tag: 'Q', xM: 5, yM: 0, contents: 'crude' }),
    makeTank({ id: 'r', tag: 'R', xM: 0, yM: 6, heightM: 8 }),
  ], [], { id: 'site-close', flashDensity: 6 })
  const reference = engine1 as Record<string, { seed: number, years: number, year: number[], tankStart: number[], tankIndex: number[] }>

  for (const [name, site] of [['battery', battery()], ['close', close]] as const) {
    it(`${name}: with spread off, the events are engine 1.0.0's events (years and tanks), bit for bit`, () => {
      // Reference: the event table engine 1.0.0 (before damage ratios) produced for this site and seed,
      // recorded in fixtures/engine-1-events.json; only the losses (the damage rule) may differ.
      const ref = reference[name]!
      const r = simulateSiteYears(site, off, { runSeed: ref.seed, years: ref.years })
      expect(Array.from(r.events.year)).toEqual(ref.year)
      expect(Array.from(r.events.tankStart)).toEqual(ref.tankStart)
      expect(Array.from(r.events.tankIndex)).toEqual(ref.tankIndex)
    })
  }
  it('with spread on, the tanks the flashes lit keep their losses bit for bit; spread only adds tanks', () => {
    const r0 = simulateSiteYears(close, off, { runSeed: 21, years: 4000 })
    const r1 = simulateSiteYears(close, a, { runSeed: 21, years: 4000 })
    expect(Array.from(r1.events.year)).toEqual(Array.from(r0.events.year))
    let spread = 0
    for (let e = 0; e < r0.events.year.length; e++) {
      const lit1: number[] = []
      for (let k = r1.events.tankStart[e]!; k < r1.events.tankStart[e + 1]!; k++) {
        if (r1.events.tankBySpread[k] === 0) lit1.push(r1.events.tankLoss[k]!)
        else spread += 1
      }
      expect(lit1).toEqual(Array.from(r0.events.tankLoss.subarray(r0.events.tankStart[e]!, r0.events.tankStart[e + 1]!)))
    }
    expect(spread).toBeGreaterThan(0)
  })
  it('a neighbour at zero distance with probability 1 always burns with the tank', () => {
    const certain = parseAssumptions({ fireSpread: { probabilityAtContact: 1, maxDistanceM: 0 } })
    // Two 4 m tanks with centres 4 m apart touch (hand-worked: 4 − 2 − 2 = 0).
    const pair = makeSite([makeTank({ id: 'x', tag: 'X', xM: 0 }), makeTank({ id: 'y', tag: 'Y', xM: 4 })], [], { id: 'pair', flashDensity: 10 })
    const r = simulateSiteYears(pair, certain, { runSeed: 3, years: 3000 })
    expect(r.events.year.length).toBeGreaterThan(20)
    for (let e = 0; e < r.events.year.length; e++) expect(r.events.tankCount[e]).toBe(2)
  })
  it('frequency mode and simulated years agree on expected loss with spread, within their intervals', () => {
    const strong = parseAssumptions({ fireSpread: { probabilityAtContact: 0.6, decayLengthM: 8 } })
    const f = simulateSiteFrequency(close, strong, { runSeed: 5, targetRse: 0.01 })
    const y = simulateSiteYears(close, strong, { runSeed: 5, years: 200_000 })
    const se = Math.hypot(f.totals.expectedAnnualLoss.se, y.summary.averageAnnualLossSe)
    // Two independent estimates of one expectation: within 3 combined standard errors (common practice).
    expect(Math.abs(f.totals.expectedAnnualLoss.rate - y.summary.averageAnnualLoss)).toBeLessThan(3 * se)
    const seBi = Math.hypot(f.totals.expectedAnnualLossBi.se, y.businessInterruption.summary.averageAnnualLossSe)
    expect(Math.abs(f.totals.expectedAnnualLossBi.rate - y.businessInterruption.summary.averageAnnualLoss)).toBeLessThan(3 * seBi)
    // Spread adds loss: more than without it (same ignitions).
    const fOff = simulateSiteFrequency(close, parseAssumptions({ fireSpread: { model: 'off' } }), { runSeed: 5, targetRse: 0.01 })
    expect(f.totals.expectedAnnualLoss.rate).toBeGreaterThan(fOff.totals.expectedAnnualLoss.rate)
    // PD + BI = total in frequency mode, per tank and per site.
    expect(f.totals.expectedAnnualLossPd.rate + f.totals.expectedAnnualLossBi.rate).toBeCloseTo(f.totals.expectedAnnualLoss.rate, 6)
    for (const t of f.tanks) expect(t.expectedAnnualLossPd.rate + t.expectedAnnualLossBi.rate).toBeCloseTo(t.expectedAnnualLoss.rate, 6)
  })
})
