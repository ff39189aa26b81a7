// Current sampling, the empirical law, and the ignition rules.
import { describe, expect, it } from 'vitest'
import {
  createStream, empiricalLaw, flashDensityFromThunderstormDays, ignitionGivenDirect, ignitionGivenSpark, parseAssumptions,
  powerLaw, tankSeverity, truncate,
} from '../../../shared/engine/index'
import { makeTank } from './fixtures'

describe('inversion sampling', () => {
  it('draws follow the truncated law', () => {
    const law = truncate(powerLaw(31, 2.6), 2, 400)
    const rand = createStream(1, 'test', 'currents')
    const n = 200_000
    let above = 0
    for (let k = 0; k < n; k++) if (law.quantile(rand()) >= 100) above += 1
    const p = law.exceedance(100)
    expect(Math.abs(above / n - p)).toBeLessThan(3 * Math.sqrt(p * (1 - p) / n)) // binomial 3-σ band (common practice)
    expect(law.logQuantile(0.3)).toBeCloseTo(Math.log(law.quantile(0.3)), 12)
  })
  it('the empirical law interpolates log current between sorted records (Hyndman & Fan type 7)', () => {
    const law = empiricalLaw([30, 10, 20])
    expect(law.quantile(0.5)).toBeCloseTo(20, 12) // middle record
    expect(law.quantile(0.25)).toBeCloseTo(Math.sqrt(10 * 20), 12) // halfway in ln I between 10 and 20 kA
    expect(law.cdf(20)).toBeCloseTo(0.5, 12)
    expect(law.cdf(5)).toBe(0)
    expect(law.cdf(40)).toBe(1)
  })
  it('thunderstorm days must be a number ≥ 0', () => {
    expect(() => flashDensityFromThunderstormDays(-1)).toThrow(/thunderstorm days/)
  })
})

describe('ignition and loss rules (MODEL.md §4, assumption-set values)', () => {
  const a = parseAssumptions({})
  it('by contents, with vapour control and vapour space', () => {
    expect(ignitionGivenSpark(makeTank({ contents: 'condensate' }), a)).toBe(0.4)
    expect(ignitionGivenSpark(makeTank({ contents: 'crude' }), a)).toBe(0.3)
    expect(ignitionGivenSpark(makeTank({ contents: 'produced_water' }), a)).toBe(0.1)
    expect(ignitionGivenSpark(makeTank({ contents: 'fresh_water' }), a)).toBe(0)
    expect(ignitionGivenSpark(makeTank({ contents: 'crude', vapourControl: true }), a)).toBeCloseTo(0.3 * 0.3, 12)
    expect(ignitionGivenSpark(makeTank({ flammableVapourSpace: false }), a)).toBe(0)
  })
  it('chemicals by flash point: at or below 60 °C (or unknown) like condensate, above it low', () => {
    expect(ignitionGivenSpark(makeTank({ contents: 'chemical', chemicalFlashPointC: 23 }), a)).toBe(0.4)
    expect(ignitionGivenSpark(makeTank({ contents: 'chemical', chemicalFlashPointC: 60 }), a)).toBe(0.4) // GHS: flammable liquids have flash point ≤ 60 °C
    expect(ignitionGivenSpark(makeTank({ contents: 'chemical', chemicalFlashPointC: 93 }), a)).toBe(0.02)
    expect(ignitionGivenSpark(makeTank({ contents: 'chemical', chemicalFlashPointC: null }), a)).toBe(0.4)
  })
  it('direct strikes: non-conducting 0.5, steel 0.02, no vapour space 0', () => {
    expect(ignitionGivenDirect(makeTank({ material: 'frp' }), a)).toBe(0.5)
    expect(ignitionGivenDirect(makeTank({ material: 'polyethylene' }), a)).toBe(0.5)
    expect(ignitionGivenDirect(makeTank({ material: 'steel' }), a)).toBe(0.02)
    expect(ignitionGivenDirect(makeTank({ flammableVapourSpace: false }), a)).toBe(0)
  })
  it('severity adds the four money figures', () => {
    expect(tankSeverity(makeTank())).toBe(200_000) // 100 000 + 50 000 + 30 000 + 20 000
  })
})
