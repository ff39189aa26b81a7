// The runs' event-band heat maps stop sampling at a stated precision (shared/engine/heatmap.ts,
// RUN_EVENT_BANDS). Checked against references that share only the kernel:
// - the same estimator with ten times the run's largest sample (400,000 candidates, another seed):
//   every cell's share within 4 combined standard errors (a normal deviate beyond 4 has probability
//   6e-5 per cell; common practice for Monte Carlo agreement checks);
// - the stated standard error against the spread of the shares over 24 independent seeds (batch-means
//   errors, Cochran 1977 §6.4: the stated and the observed spread agree within a factor of two at
//   24 replicates, whose sample sd itself scatters by about ±15 %);
// - the total event rate against frequency mode's direct-strike and sparking figures, within their errors.
import { describe, expect, it } from 'vitest'
import { parseAssumptions } from '../../shared/engine/assumptions'
import { RUN_EVENT_BANDS, siteEventBands } from '../../shared/engine/heatmap'
import { simulateSiteFrequency } from '../../shared/engine/frequency'
import type { SiteInput } from '../../shared/engine/types'
import { battery, makeSite, makeTank } from '../unit/engine/fixtures'

const a = parseAssumptions({})

// Invented test layouts: one tank; three tanks in a row with a mast (shadowing); a tank with nothing
// inside that can spark (struck directly only) beside one that can.
const LAYOUTS: SiteInput[] = [
  makeSite([makeTank()], [], { id: 'one' }),
  battery({ id: 'battery' }),
  makeSite([makeTank({ id: 'bare', tag: 'BARE', components: [] }), makeTank({ id: 'fitted', tag: 'FIT', xM: 12, yM: 5, heightM: 8 })], [], { id: 'bare' }),
]

const reference = (site: SiteInput, seed: number) =>
  siteEventBands(site, a, { runSeed: seed, samples: 400_000, precision: { shareSe: 0, totalRse: 0, minSamples: 400_000, batch: 10_000 } })

describe('event bands at the runs\' stated precision', () => {
  for (const site of LAYOUTS) {
    it(`${site.id}: stops within 8,000–40,000 candidates at its stated precision and agrees with 400,000 candidates`, () => {
      const run = siteEventBands(site, a, { runSeed: 7, ...RUN_EVENT_BANDS })
      expect(run.samples).toBeGreaterThanOrEqual(8_000)
      expect(run.samples).toBeLessThanOrEqual(40_000)
      if (run.samples! < 40_000) expect(run.largestShareSe).toBeLessThanOrEqual(0.005)
      expect(run.share.flat().reduce((s, x) => s + x, 0)).toBeCloseTo(1, 9)
      const ref = reference(site, 1234)
      expect(ref.samples).toBe(400_000)
      const bound = 4 * Math.hypot(run.largestShareSe!, ref.largestShareSe!)
      const refShares = ref.share.flat()
      run.share.flat().forEach((s, c) => expect(Math.abs(s - refShares[c]!), `cell ${c}`).toBeLessThanOrEqual(bound))
      expect(Math.abs(run.totalRatePerYear / ref.totalRatePerYear - 1)).toBeLessThan(4 * Math.hypot(0.02, 0.005)) // total RSE ≤ 2 % by the stop rule
      // Deterministic: the same seed gives the same picture, whatever runs it.
      expect(siteEventBands(site, a, { runSeed: 7, ...RUN_EVENT_BANDS })).toEqual(run)
    })
  }

  it('the stated standard error matches the spread over independent seeds', () => {
    const site = LAYOUTS[1]!
    const runs = Array.from({ length: 24 }, (_, k) => siteEventBands(site, a, { runSeed: 100 + k, ...RUN_EVENT_BANDS }))
    const shares = runs.map(r => r.share.flat())
    // The cell with the largest mean share (the others are noisier relative to it, and their se is bounded by the largest).
    const mean = shares[0]!.map((_, c) => shares.reduce((s, x) => s + x[c]!, 0) / shares.length)
    const cell = mean.indexOf(Math.max(...mean))
    const sd = Math.sqrt(shares.reduce((s, x) => s + (x[cell]! - mean[cell]!) ** 2, 0) / (shares.length - 1))
    const stated = runs.reduce((s, r) => s + r.largestShareSe!, 0) / runs.length
    expect(sd).toBeGreaterThan(0)
    expect(sd).toBeLessThanOrEqual(2 * stated) // the largest stated se bounds the spread of any one cell
    expect(sd).toBeGreaterThan(stated / 3) // and is not a wild over-statement either
  })

  it('the total event rate agrees with frequency mode\'s direct strikes plus sparking', () => {
    for (const site of LAYOUTS) {
      const bands = siteEventBands(site, a, { runSeed: 3, ...RUN_EVENT_BANDS })
      const f = simulateSiteFrequency(site, a, { runSeed: 3, targetRse: 0.01 })
      const expected = f.totals.direct.rate + f.totals.sparking.rate
      const se = Math.hypot(f.totals.direct.se, f.totals.sparking.se, 0.02 * bands.totalRatePerYear)
      expect(Math.abs(bands.totalRatePerYear - expected), site.id).toBeLessThanOrEqual(4 * se)
    }
  })
})
