// Internal consistency: frequency mode, year mode and the quadrature reference (MODEL.md §5–6) agree;
// the sharp-threshold case meets its closed form.
import { describe, expect, it } from 'vitest'
import {
  isolatedTankQuadrature, parseAssumptions, powerLaw, ruskCoupling, simulateSiteFrequency, simulateSiteYears,
  normalQuantile, lateralAttractionDistance,
} from '../../../shared/engine/index'
import type { AssumptionSetInput, TankInput } from '../../../shared/engine/index'
import { battery, makeSite, makeTank } from './fixtures'

interface Case { name: string; tank: TankInput; ng: number; assumptions: AssumptionSetInput }

const empiricalCurrents = Array.from({ length: 200 }, (_, i) => 31 * Math.exp(0.55 * normalQuantile((i + 0.5) / 200)))

const cases: Case[] = [
  { name: 'IEEE power law, 10 m tank, sharp device', tank: makeTank(), ng: 4, assumptions: {} },
  {
    name: 'CIGRE log-normal, short tank, several classes', ng: 2, assumptions: { currentLaw: 'lognormal' },
    tank: makeTank({ heightM: 6, diameterM: 3, contents: 'crude', components: [{ componentClass: 'grounded_pipe', count: 2, heightM: 5 }, { componentClass: 'carbon_fibre', count: 1, heightM: 3 }] }),
  },
  {
    name: 'empirical law, tall tank, high wide threshold', ng: 6,
    assumptions: { currentLaw: 'empirical', empiricalCurrentsKa: empiricalCurrents, thresholds: { rounded_conductor: { u50Kv: 140, sigma: 0.5 } } },
    tank: makeTank({ heightM: 15, diameterM: 6, components: [{ componentClass: 'rounded_conductor', count: 1, heightM: 12 }] }),
  },
  { name: 'IEC 62305-2 collection-area attachment', tank: makeTank({ heightM: 8 }), ng: 3, assumptions: { attachmentModel: 'collection_area' } },
  { name: 'shielded tank (60 kA)', tank: makeTank({ shieldRatingKa: 60 }), ng: 4, assumptions: {} },
  { name: 'line-style EGM (kg = 0.9, A = 8)', tank: makeTank({ heightM: 12 }), ng: 4, assumptions: { groundStrikingFactor: 0.9, strikingDistanceA: 8 } },
]

describe('isolated tanks: frequency mode and year mode match the quadrature', () => {
  for (const c of cases) {
    it(c.name, () => {
      const a = parseAssumptions(c.assumptions)
      const q = isolatedTankQuadrature(c.tank, c.ng, a)
      const site = makeSite([c.tank], [], { flashDensity: c.ng })
      const f = simulateSiteFrequency(site, a, { runSeed: 11, targetRse: 0.01 }).tanks[0]!
      // Within 3 standard errors (common practice for a Monte Carlo check against a reference).
      expect(Math.abs(f.direct.rate - q.directPerYear)).toBeLessThanOrEqual(3 * f.direct.se + 1e-12)
      expect(Math.abs(f.sparking.rate - q.sparkingPerYear)).toBeLessThanOrEqual(3 * f.sparking.se + 1e-12)
      expect(Math.abs(f.ignition.rate - q.ignitionPerYear)).toBeLessThanOrEqual(3 * f.ignition.se + 1e-12)
      const years = 20_000
      const y = simulateSiteYears(site, a, { runSeed: 11, years }).tanks[0]!
      // Year mode: Poisson counts, standard error √n / Y.
      for (const [count, reference] of [[y.direct.count, q.directPerYear], [y.sparking.count, q.sparkingPerYear], [y.ignition.count, q.ignitionPerYear]] as const) {
        expect(Math.abs(count / years - reference)).toBeLessThanOrEqual(3 * Math.sqrt(Math.max(count, 1)) / years)
      }
    })
  }
})

describe('quadrature', () => {
  it('converges: doubling the resolution changes nothing at 1e-6', () => {
    const a = parseAssumptions({ currentLaw: 'lognormal' })
    const q1 = isolatedTankQuadrature(makeTank(), 4, a)
    const q2 = isolatedTankQuadrature(makeTank(), 4, a, { resolution: 2 })
    expect(q2.sparkingPerYear / q1.sparkingPerYear).toBeCloseTo(1, 6) // MODEL.md §6: 1e-6 relative accuracy
    expect(q2.directPerYear / q1.directPerYear).toBeCloseTo(1, 6)
  })
  it('direct strikes equal ∫ f(i)·πD(i)² di computed here with the closed-form D (MODEL.md §2)', () => {
    const a = parseAssumptions({})
    const law = powerLaw(31, 2.6)
    const mass = law.cdf(400) - law.cdf(2)
    // Composite Simpson in ln i on [ln 2, ln 400], density of ln I for the IEEE Std 1410 law: k·x/(1+x)², x = (i/31)^k.
    const n = 20_000
    const h = Math.log(200) / n
    let sum = 0
    for (let k = 0; k <= n; k++) {
      const s = Math.log(2) + k * h
      const x = Math.pow(Math.exp(s) / 31, 2.6)
      const d = lateralAttractionDistance(Math.exp(s), 10, 2, a)
      sum += (k === 0 || k === n ? 1 : k % 2 === 1 ? 4 : 2) * (2.6 * x / (1 + x) ** 2) * Math.PI * d * d
    }
    const expected = 4e-6 * (sum * h / 3) / mass
    expect(isolatedTankQuadrature(makeTank(), 4, a).directPerYear / expected).toBeCloseTo(1, 6)
  })
})

describe('sharp threshold (σ → 0), no truncation: MODEL.md §6 closed form', () => {
  // Inner integral π(y_s(i)² − D(i)²)⁺ with y_s = Kc·i·h/U50; outer over the IEEE Std 1410 law,
  // integrated here by Simpson's rule in ln i over 0.01 … 10⁵ kA (mass outside < 2e-9: "no truncation").
  const a = parseAssumptions({ currentMinKa: 0.01, currentMaxKa: 1e5, thresholds: { sharp_device: { u50Kv: 70, sigma: 0 } } })
  const tank = makeTank({ heightM: 10, diameterM: 4, components: [{ componentClass: 'sharp_device', count: 1, heightM: 8 }] })
  const kc = ruskCoupling(1.2e8)
  const n = 200_000
  const lo = Math.log(0.01)
  const h = (Math.log(1e5) - lo) / n
  let sum = 0
  for (let k = 0; k <= n; k++) {
    const i = Math.exp(lo + k * h)
    const x = Math.pow(i / 31, 2.6)
    const ys = kc * i * 8 / 70
    const d = lateralAttractionDistance(i, 10, 2, a)
    sum += (k === 0 || k === n ? 1 : k % 2 === 1 ? 4 : 2) * (2.6 * x / (1 + x) ** 2) * Math.PI * Math.max(0, ys * ys - d * d)
  }
  const closedForm = 4e-6 * sum * h / 3

  it('the quadrature meets it', () => {
    expect(isolatedTankQuadrature(tank, 4, a).sparkingPerYear / closedForm).toBeCloseTo(1, 4)
  })
  it('frequency mode meets it within 3 standard errors', () => {
    const f = simulateSiteFrequency(makeSite([tank]), a, { runSeed: 5, targetRse: 0.01 }).tanks[0]!
    expect(Math.abs(f.sparking.rate - closedForm)).toBeLessThanOrEqual(3 * f.sparking.se)
  })
})

describe('a site with neighbours: frequency mode and year mode agree within their intervals', () => {
  it('per tank and for the site', () => {
    const site = battery()
    const a = parseAssumptions({})
    const f = simulateSiteFrequency(site, a, { runSeed: 21, targetRse: 0.01 })
    const years = 40_000
    const y = simulateSiteYears(site, a, { runSeed: 21, years })
    const close = (freq: { rate: number; se: number }, count: number) =>
      expect(Math.abs(freq.rate - count / years)).toBeLessThanOrEqual(3 * Math.hypot(freq.se, Math.sqrt(Math.max(count, 1)) / years))
    f.tanks.forEach((ft, i) => {
      const yt = y.tanks[i]!
      close(ft.direct, yt.direct.count)
      close(ft.sparking, yt.sparking.count)
      close(ft.ignition, yt.ignition.count)
      expect(Math.abs(ft.expectedAnnualLoss.rate - yt.averageAnnualLoss.mean)).toBeLessThanOrEqual(3 * Math.hypot(ft.expectedAnnualLoss.se, yt.averageAnnualLoss.se))
    })
    expect(Math.abs(f.totals.expectedAnnualLoss.rate - y.summary.averageAnnualLoss)).toBeLessThanOrEqual(3 * Math.hypot(f.totals.expectedAnnualLoss.se, y.summary.averageAnnualLossSe))
  })
})
