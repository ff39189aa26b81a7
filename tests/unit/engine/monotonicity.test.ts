// Directions the model must move in (MODEL.md §2–4), and the mast that both shields and exposes.
import { describe, expect, it } from 'vitest'
import { isolatedTankQuadrature, parseAssumptions, simulateSiteFrequency } from '../../../shared/engine/index'
import type { SiteInput, TankInput } from '../../../shared/engine/index'
import { battery, makeSite, makeTank } from './fixtures'

const a = parseAssumptions({})
const freq = (site: SiteInput, assumptions = a) => simulateSiteFrequency(site, assumptions, { runSeed: 3, targetRse: 0.01 })
const withTank = (site: SiteInput, id: string, over: Partial<TankInput>): SiteInput => ({ ...site, tanks: site.tanks.map((t) => (t.id === id ? { ...t, ...over } : t)) })
/** b ≥ a "beyond sampling error": b − a > −3·(combined standard error). */
const notBelow = (x: { rate: number; se: number }, y: { rate: number; se: number }) => expect(y.rate - x.rate).toBeGreaterThan(-3 * Math.hypot(x.se, y.se))

describe('more flash density, taller components, lower thresholds → more events', () => {
  it('flash density scales every frequency exactly (same draws, Ng is a factor)', () => {
    const base = freq(battery())
    const double = freq(battery({ flashDensity: 8 }))
    base.tanks.forEach((t, i) => {
      expect(double.tanks[i]!.sparking.rate / t.sparking.rate).toBeCloseTo(2, 10) // MODEL.md §1: λ ∝ Ng
      expect(double.tanks[i]!.direct.rate / t.direct.rate).toBeCloseTo(2, 10)
    })
  })
  it('a taller component sparks more often (quadrature and a site)', () => {
    const low = isolatedTankQuadrature(makeTank({ components: [{ componentClass: 'grounded_pipe', count: 1, heightM: 4 }] }), 4, a)
    const high = isolatedTankQuadrature(makeTank({ components: [{ componentClass: 'grounded_pipe', count: 1, heightM: 8 }] }), 4, a)
    expect(high.sparkingPerYear).toBeGreaterThan(low.sparkingPerYear) // Rusk: V ∝ h
    const site = battery()
    const taller = withTank(site, 'c', { components: [{ componentClass: 'rounded_conductor', count: 1, heightM: 6 }] })
    expect(freq(taller).tanks[2]!.sparking.rate).toBeGreaterThan(freq(site).tanks[2]!.sparking.rate + 3 * freq(site).tanks[2]!.sparking.se)
  })
  it('a lower sparking threshold sparks more often', () => {
    const lower = parseAssumptions({ thresholds: { rounded_conductor: { u50Kv: 100 } } })
    const base = freq(battery())
    const more = freq(battery(), lower)
    expect(more.tanks[2]!.sparking.rate).toBeGreaterThan(base.tanks[2]!.sparking.rate + 3 * base.tanks[2]!.sparking.se)
  })
})

describe('mitigations never increase induced sparking beyond sampling error', () => {
  const base = freq(battery())
  it('an induced-sparking shield', () => {
    for (const rating of [20, 60, 150]) {
      const shielded = freq(withTank(battery(), 'b', { shieldRatingKa: rating }))
      notBelow(shielded.tanks[1]!.sparking, base.tanks[1]!.sparking)
      expect(shielded.tanks[1]!.sparking.rate).toBeLessThan(base.tanks[1]!.sparking.rate)
    }
  })
  it('removing a component class', () => {
    const fewer = freq(withTank(battery(), 'b', { components: [{ componentClass: 'grounded_pipe', count: 2, heightM: 7 }] }))
    notBelow(fewer.tanks[1]!.sparking, base.tanks[1]!.sparking)
  })
  it('a steel tank has no induced sparking at all', () => {
    const steel = freq(withTank(battery(), 'b', { material: 'steel' }))
    expect(steel.tanks[1]!.sparking.rate).toBe(0) // MODEL.md §4: a steel tank has no induced-sparking term
    expect(steel.tanks[1]!.direct.rate).toBeGreaterThan(0)
  })
})

describe('a mast beside a tank', () => {
  it('cuts the tank’s direct strikes and raises its induced sparking', () => {
    const tank = makeTank({ heightM: 8, diameterM: 4 })
    // A 0.3 % target: the mast raises sparking by about 3 % here, which a 1 % target cannot resolve at 3 SE.
    const precise = (site: SiteInput) => simulateSiteFrequency(site, a, { runSeed: 3, targetRse: 0.003 })
    const alone = precise(makeSite([tank]))
    const withMast = precise(makeSite([tank], [{ id: 'mast', kind: 'mast', xM: 15, yM: 0, heightM: 30, radiusM: 0.3 }]))
    const t0 = alone.tanks[0]!
    const t1 = withMast.tanks[0]!
    // Shielding: the mast wins most leaders that would have reached the tank (MODEL.md §2).
    expect(t1.direct.rate).toBeLessThan(0.5 * t0.direct.rate)
    // Exposure: flashes drawn to the mast attach 15 m from the tank and induce high potentials.
    expect(t1.sparking.rate).toBeGreaterThan(t0.sparking.rate + 3 * Math.hypot(t0.sparking.se, t1.sparking.se))
  })
})
