// Reproducibility (MODEL.md §5): same inputs and run seed → bit-identical output, whatever else is in
// the batch and in whatever order (each site's streams derive from run seed + site id + purpose).
import { describe, expect, it } from 'vitest'
import { parseAssumptions, rollUpFrequency, rollUpYears, simulateSiteFrequency, simulateSiteYears, streamSeed } from '../../../shared/engine/index'
import { battery, makeSite, makeTank } from './fixtures'

const a = parseAssumptions({})
const siteA = battery({ id: 'alpha' })
const siteB = makeSite([makeTank({ id: 'solo' })], [], { id: 'bravo', flashDensity: 2 })
const siteC = makeSite([makeTank({ id: 'x', heightM: 6 }), makeTank({ id: 'y', xM: 12 })], [], { id: 'charlie', flashDensity: 7 })

function runBatch(sites: typeof siteA[], seed: number) {
  return sites.map((s) => simulateSiteFrequency(s, a, { runSeed: seed, targetRse: 0.03 }))
}

describe('frequency mode', () => {
  it('same seed → identical output', () => {
    expect(JSON.stringify(runBatch([siteA], 7))).toBe(JSON.stringify(runBatch([siteA], 7))) // common practice: seeded runs replay exactly
  })
  it("a site's result does not depend on the other sites or their order (chunking)", () => {
    const alone = runBatch([siteA], 7)[0]
    const inBatch = runBatch([siteC, siteB, siteA], 7)[2]
    expect(JSON.stringify(inBatch)).toBe(JSON.stringify(alone))
  })
  it('the portfolio roll-up does not depend on chunk order', () => {
    const one = rollUpFrequency(runBatch([siteA, siteB, siteC], 7))
    const two = rollUpFrequency(runBatch([siteC, siteA, siteB], 7))
    expect(JSON.stringify(two)).toBe(JSON.stringify(one))
  })
  it('another seed gives other draws', () => {
    expect(runBatch([siteA], 8)[0]!.tanks[0]!.sparking.rate).not.toBe(runBatch([siteA], 7)[0]!.tanks[0]!.sparking.rate)
  })
})

describe('year mode', () => {
  const years = 2000
  const run = (site: typeof siteA) => simulateSiteYears(site, a, { runSeed: 'run-42', years })
  it('same seed → identical year-loss table and events', () => {
    const x = run(siteA)
    const y = run(siteA)
    expect(Array.from(y.yearLosses)).toEqual(Array.from(x.yearLosses))
    expect(Array.from(y.events.tankLoss)).toEqual(Array.from(x.events.tankLoss))
    expect(JSON.stringify(y.tanks)).toBe(JSON.stringify(x.tanks))
  })
  it('portfolio tables do not depend on site order', () => {
    const p1 = rollUpYears([run(siteA), run(siteB), run(siteC)])
    const p2 = rollUpYears([run(siteC), run(siteB), run(siteA)])
    expect(Array.from(p2.yearLosses)).toEqual(Array.from(p1.yearLosses))
  })
  it('streams are keyed by run, site and purpose', () => {
    expect(streamSeed(1, 'alpha', 'years')).not.toBe(streamSeed(1, 'bravo', 'years'))
    expect(streamSeed(1, 'alpha', 'years')).not.toBe(streamSeed(2, 'alpha', 'years'))
    expect(streamSeed(1, 'alpha', 'years')).not.toBe(streamSeed(1, 'alpha', 'frequency/a'))
  })
})
