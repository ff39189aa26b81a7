// Accumulation view: worst years, per-site shares and co-losing groups from year-mode loss events.
import { describe, expect, it } from 'vitest'
import { accumulation, type AccumulationSiteEvents } from '../../shared/results/accumulation'
import { lossAtReturnPeriod, tailValueAtRisk } from '../../shared/engine/exceedance'
import { createStream } from '../../shared/engine/random'

const site = (siteId: string, pairs: [number, number][]): AccumulationSiteEvents => ({ siteId, year: pairs.map(p => p[0]), loss: pairs.map(p => p[1]) })

describe('accumulation', () => {
  it('groups two sites that always lose in the same years and leaves out one that never does', () => {
    // Constructed run, 1,000 years: A (100 per year) and B (50 per year) lose in years 0–19 only;
    // C loses 1 in years 500–519. T = 100 ⇒ the 10 worst years; ties go to the earlier year ⇒ years 0–9.
    // Hand-worked: worst-year loss 10 × 150 = 1,500; A's share 1,000/1,500 = 2/3, B's 1/3, C's 0.
    const ab = Array.from({ length: 20 }, (_, y) => y)
    const a = accumulation(1000, [
      site('A', ab.map(y => [y, 100])),
      site('B', ab.map(y => [y, 50])),
      site('C', ab.map(y => [500 + y, 1])),
    ])
    expect(a.worstYears.map(w => w.year)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9])
    expect(a.worstYearsLoss).toBe(1500)
    expect(a.groups).toHaveLength(1)
    expect(a.groups[0]!.siteIds.sort()).toEqual(['A', 'B'])
    expect(a.groups[0]!.share).toBeCloseTo(1, 12)
    expect(a.groups[0]!.allTogetherYears).toBe(10)
    const by = Object.fromEntries(a.sites.map(s => [s.siteId, s]))
    expect(by.A!.share).toBeCloseTo(2 / 3, 12)
    expect(by.B!.share).toBeCloseTo(1 / 3, 12)
    expect(by.C!.share).toBe(0)
    expect(by.C!.group).toBeNull()
    expect(by.A!.lossYearShare).toBe(1)
    expect(a.sites.reduce((s, r) => s + r.share, 0)).toBeCloseTo(1, 12)
  })

  it('does not join sites that lose in different worst years', () => {
    // A loses big in even years 0–18, B in odd years 1–19: the 10 worst years hold five of each, never both ⇒ no group.
    const a = accumulation(1000, [
      site('A', Array.from({ length: 10 }, (_, i) => [2 * i, 100 + i] as [number, number])),
      site('B', Array.from({ length: 10 }, (_, i) => [2 * i + 1, 100 + i] as [number, number])),
    ])
    expect(a.groups).toHaveLength(0)
    expect(a.sites.every(s => s.group === null)).toBe(true)
  })

  it('agrees with a brute force on random losses: worst years, threshold and TVaR, shares adding up', () => {
    // Reference: sort of the portfolio year losses (brute force) and the engine's own exceedance
    // functions (shared/engine/exceedance.ts): the k-th largest is the loss at T = Y/k, the mean of the k largest the TVaR.
    const u = createStream(5, 'test', 'accumulation')
    const years = 5000
    const sites = Array.from({ length: 30 }, (_, i) => {
      const pairs: [number, number][] = []
      for (let y = 0; y < years; y++) if (u() < 0.02) pairs.push([y, Math.floor(u() * 1e6)])
      return site(`S${i}`, pairs)
    })
    const a = accumulation(years, sites, { returnPeriodYears: 250, minShareTogether: 0.5 })
    const portfolio = new Float64Array(years)
    for (const s of sites) for (let e = 0; e < s.year.length; e++) portfolio[s.year[e]!]! += s.loss[e]!
    const sorted = Float64Array.from(portfolio).sort().reverse()
    expect(a.worstYears).toHaveLength(20)
    expect(a.worstYears.map(w => w.loss)).toEqual([...sorted.slice(0, 20)])
    expect(a.thresholdLoss).toBe(lossAtReturnPeriod(sorted, 250))
    expect(a.worstYearsLoss / 20).toBeCloseTo(tailValueAtRisk(sorted, 250)!, 6)
    expect(a.sites.reduce((s, r) => s + r.worstYearsLoss, 0)).toBeCloseTo(a.worstYearsLoss, 4)
    // Independent sites with 2 % loss years rarely share two of the 20 worst years at a Jaccard of ½.
    expect(a.groups.length).toBeLessThanOrEqual(1)
  })

  it('has no worst years in a run without loss', () => {
    const a = accumulation(100, [site('A', [])])
    expect(a.worstYears).toEqual([])
    expect(a.worstYearsLoss).toBe(0)
    expect(a.sites[0]!.share).toBe(0)
  })
})
