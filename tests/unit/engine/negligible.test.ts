// The negligible-rate rule as a run option (issue 15): figures it stops are marked and given as an
// upper bound; with the rule off the same tank is refined to the target.
import { describe, expect, it } from 'vitest'
import { isolatedTankQuadrature, parseAssumptions, simulateSiteFrequency } from '../../../shared/engine/index'
import { makeSite, makeTank } from './fixtures'

const a = parseAssumptions({})
// One lone tank at a flash density so low that its sparking is far below 1e-5 /yr (invented input).
const tank = makeTank()
const site = makeSite([tank], [], { flashDensity: 2e-5 })
const reference = isolatedTankQuadrature(tank, site.flashDensity, a) // MODEL.md §6 quadrature

describe('negligible-rate rule', () => {
  it('the default (1e-5 /yr) stops the figure and reports an upper bound only', () => {
    expect(reference.sparkingPerYear).toBeLessThan(1e-5) // the premise of the test
    const t = simulateSiteFrequency(site, a, { runSeed: 8, targetRse: 0.01 }).tanks[0]!
    expect(t.sparking.upperBoundOnly).toBe(true)
    expect(t.sparking.lo).toBe(0) // an upper bound has no lower end
    expect(t.sparking.hi).toBeLessThan(1e-5) // the rule's condition
    expect(t.sparking.hi).toBeGreaterThanOrEqual(reference.sparkingPerYear) // the bound holds the quadrature value
    expect(t.ignition.upperBoundOnly).toBe(true) // built on the stopped figure
    expect(t.expectedAnnualLoss.upperBoundOnly).toBe(true)
    expect(t.direct.upperBoundOnly).toBeUndefined() // direct strikes come from quadrature, never stopped
  })
  it('switched off (0), the same tank is refined to the target with a two-sided interval', () => {
    const off = simulateSiteFrequency(site, a, { runSeed: 8, targetRse: 0.01, negligibleRatePerYear: 0 }).tanks[0]!
    const on = simulateSiteFrequency(site, a, { runSeed: 8, targetRse: 0.01 }).tanks[0]!
    expect(off.sparking.upperBoundOnly).toBeUndefined()
    expect(off.sparking.se / off.sparking.rate).toBeLessThanOrEqual(0.01) // the run's target
    expect(off.samples).toBeGreaterThan(on.samples) // the rule saves samples (its purpose)
    // Within 4 standard errors of the quadrature (common practice for a Monte Carlo check).
    expect(Math.abs(off.sparking.rate - reference.sparkingPerYear)).toBeLessThan(4 * off.sparking.se)
  })
})
