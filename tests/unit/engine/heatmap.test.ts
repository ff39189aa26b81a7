// Heat-map data for the what-if panel and the site view.
import { describe, expect, it } from 'vitest'
import {
  componentSparkingProbability, inducedPotentialKv, lateralAttractionDistance, parseAssumptions, ruskCoupling,
  simulateSiteFrequency, siteEventBands, tankSparkingHeatmap,
} from '../../../shared/engine/index'
import { battery, makeTank } from './fixtures'

const a = parseAssumptions({})

describe('tank heat map (current × distance)', () => {
  const tank = makeTank({ heightM: 10, diameterM: 4 })
  const map = tankSparkingHeatmap(tank, null, a, { currentsKa: [5, 31, 100], distancesM: [10, 40, 100, 400, 1500] })
  it('marks the direct-strike zone: distance inside D(I) (MODEL.md §2)', () => {
    map.currentsKa.forEach((i, r) => map.distancesM.forEach((d, c) => {
      expect(map.directZone[r]![c]).toBe(d < lateralAttractionDistance(i, 10, 2, a))
    }))
  })
  it('outside it, the sparking probability of Rusk’s potential (MODEL.md §3–4)', () => {
    const cell = map.sparkingProbability[1]![3]! // 31 kA at 400 m
    const v = inducedPotentialKv(ruskCoupling(1.2e8), 31, 8, 400)
    expect(cell).toBeCloseTo(componentSparkingProbability(v, 70, 0.3), 6)
  })
  it('with its site, a mast close by changes the picture', () => {
    const site = battery()
    const inSite = tankSparkingHeatmap(site.tanks[0]!, site, a, { currentsKa: [31], distancesM: [12] })
    expect(inSite.directShare[0]![0]).toBeLessThan(1)
  })
})

describe('site event bands (current band × distance band)', () => {
  it('shares add to one and the rate matches frequency mode', () => {
    const site = battery()
    const bands = siteEventBands(site, a, { runSeed: 4, samples: 200_000 })
    const total = bands.share.flat().reduce((s, x) => s + x, 0)
    expect(total).toBeCloseTo(1, 9)
    const f = simulateSiteFrequency(site, a, { runSeed: 4, targetRse: 0.01 })
    const expected = f.totals.direct.rate + f.totals.sparking.rate
    expect(Math.abs(bands.totalRatePerYear / expected - 1)).toBeLessThan(0.05) // two Monte Carlo estimates of the same rate (common practice: a few % at these sample sizes)
    expect(bands.directRatePerYear.reduce((s, x) => s + x, 0) / f.totals.direct.rate).toBeGreaterThan(0.9)
  })
})
