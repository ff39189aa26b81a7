// Assumption bands for simulated-years runs (issue "How sure are we", point 2): re-simulation of
// each band draw on the same random streams as the central re-simulation, band = central × X_k / X_0.
import { describe, expect, it } from 'vitest'
import { parseAssumptions } from '../../../shared/engine/assumptions'
import { planAssumptionDraws } from '../../../shared/engine/draws'
import { bandOf } from '../../../shared/engine/draw-figures'
import { simulateSiteYears } from '../../../shared/engine/years'
import { ratioSeries, siteYearDrawValues, yearDrawBands } from '../../../shared/engine/year-draws'
import { battery, makeSite, makeTank } from './fixtures'

const lognormal = (path: string, median: number, sigmaLn: number) => ({ path, distribution: { kind: 'lognormal' as const, median, sigmaLn }, basis: 'analyst' as const, note: '' })

describe('year-mode assumption bands', () => {
  it('a draw equal to the central assumptions gives the central figure exactly (same streams)', () => {
    const set = parseAssumptions({ uncertainty: { entries: [lognormal('flashDensityFactor', 1, 0.3)], correlations: [] } })
    const plan = planAssumptionDraws(set, { draws: 50, runSeed: 9 })
    // every band draw replaced by the central set: X_k = X_0 bit for bit, the ratio is exactly 1 (common practice: CRN identity)
    const same = { ...plan, a: plan.a.map(() => plan.central) }
    const site = battery({ flashDensity: 40 })
    const v = siteYearDrawValues(site, same, { runSeed: 9, years: 500 })
    const central = v.evaluations[0]!
    for (const e of v.evaluations) expect(e).toEqual(central)
    for (const t of v.tables) expect(t).toEqual(v.tables[0])
    const b = yearDrawBands(v, { ...central, averageAnnualLoss: 1234 })
    expect(b.averageAnnualLoss).toEqual({ p05: 1234, p50: 1234, p95: 1234 })
  })

  it('with only the flash-density factor uncertain, the expected-fires draws are Poisson at rate f_k·μ (brute-force check)', () => {
    // An isolated tank without spread: its ignitions in Y years are Poisson(μ·Y) (MODEL.md §5), so with the
    // factor f_k they are Poisson(f_k·μ·Y). Pooled over draws, Σ N_k ~ Poisson(μ·Y·Σf_k): the pooled rate
    // Σ N_k / (Y Σ f_k) must agree with the central count's rate N_0 / Y within their Poisson errors (4 sd).
    const set = parseAssumptions({ uncertainty: { entries: [lognormal('flashDensityFactor', 1, 0.3)], correlations: [] } })
    const K = 60
    const plan = planAssumptionDraws(set, { draws: K, runSeed: 5 })
    const site = makeSite([makeTank({ heightM: 15, diameterM: 30 })], [], { flashDensity: 200 })
    const Y = 400
    const v = siteYearDrawValues(site, plan, { runSeed: 5, years: Y })
    const n = v.evaluations.map(e => e.expectedFires * Y)
    const n0 = n[0]!
    expect(n0).toBeGreaterThan(200) // enough events for the check to mean something
    const sumF = plan.a.reduce((s, d) => s + d.flashDensityFactor, 0)
    const sumN = n.slice(1).reduce((s, x) => s + x, 0)
    const pooled = sumN / (Y * sumF), rate0 = n0 / Y
    const sd = Math.sqrt(sumN / (Y * sumF) ** 2 + n0 / Y ** 2)
    expect(Math.abs(pooled - rate0)).toBeLessThanOrEqual(4 * sd)
    // the band follows the factor's band: each ratio N_k/N_0 is f_k up to Poisson noise of about
    // sqrt(1/N_k + 1/N_0) (≈ 9 % here), so the band's quantiles lie within that of the factor's (3 sd of the noise)
    const band = yearDrawBands(v, v.evaluations[0]!).expectedFires!
    const factor = bandOf(plan.valuesA[0]!)
    const noise = Math.sqrt(2 / n0)
    for (const q of ['p05', 'p50', 'p95'] as const) expect(Math.abs(band[q] / (rate0 * factor[q]) - 1)).toBeLessThanOrEqual(3 * noise)
    // and the factor drives them: ratio and factor correlate strongly (the factor's spread, 30 %, is ~3× the noise)
    const r = n.slice(1).map(x => x / n0), f = plan.valuesA[0]!
    const mean = (a: ArrayLike<number>) => Array.from(a).reduce((s, x) => s + x, 0) / a.length
    const mr = mean(r), mf = mean(f)
    let sxy = 0, sxx = 0, syy = 0
    for (let k = 0; k < K; k++) { sxy += (r[k]! - mr) * (f[k]! - mf); sxx += (f[k]! - mf) ** 2; syy += (r[k]! - mr) ** 2 }
    expect(sxy / Math.sqrt(sxx * syy)).toBeGreaterThan(0.8)
  })

  it('the central figures of the run are untouched and the bands use the run\'s own central figures', () => {
    const set = parseAssumptions({ uncertainty: { entries: [lognormal('thresholds.sharp_device.u50Kv', 70, 0.25)], correlations: [] } })
    const plan = planAssumptionDraws(set, { draws: 50, runSeed: 3 })
    const site = battery({ flashDensity: 30 })
    const before = simulateSiteYears(site, set, { runSeed: 3, years: 3000 })
    const v = siteYearDrawValues(site, plan, { runSeed: 3, years: 3000, drawYears: 1000 })
    expect(v.years).toBe(1000)
    const after = simulateSiteYears(site, set, { runSeed: 3, years: 3000 })
    expect(after.summary).toEqual(before.summary)
    // the 1-in-1000 (and longer) return periods need at least T re-simulated years; 2000 and more are null
    const b = yearDrawBands(v, { averageAnnualLoss: before.summary.averageAnnualLoss, expectedFires: before.totals.ignition.rate,
      aggregate: before.summary.aggregate.map(p => p.loss), occurrence: before.summary.occurrence.map(p => p.loss) })
    expect(b.averageAnnualLoss).not.toBeNull()
    expect(b.averageAnnualLoss!.p05).toBeLessThanOrEqual(b.averageAnnualLoss!.p95)
  })

  it('same inputs and seed give the same values whatever else is computed before (chunks and workers)', () => {
    const set = parseAssumptions({ uncertainty: { entries: [lognormal('flashDensityFactor', 1, 0.2), lognormal('thresholds.sharp_device.u50Kv', 70, 0.25)], correlations: [] } })
    const plan = planAssumptionDraws(set, { draws: 50, runSeed: 7 })
    const a = battery({ id: 'site-a', flashDensity: 20 }), b = battery({ id: 'site-b', flashDensity: 25 })
    const alone = siteYearDrawValues(b, plan, { runSeed: 7, years: 300 })
    siteYearDrawValues(a, plan, { runSeed: 7, years: 300 })
    const afterOther = siteYearDrawValues(b, plan, { runSeed: 7, years: 300 })
    expect(afterOther).toEqual(alone)
  })

  it('no ratio without a central value: a null or zero X_0 gives no band', () => {
    expect(ratioSeries(100, [0, 1, 2])).toBeNull()
    expect(ratioSeries(100, [null, 1, 2])).toBeNull()
    expect(ratioSeries(null, [1, 1, 2])).toBeNull()
    expect(Array.from(ratioSeries(100, [2, 1, 4])!)).toEqual([50, 200])
  })

  it('storm clustering with a drawn flash-density factor is refused with its reason', () => {
    const set = parseAssumptions({ uncertainty: { entries: [lognormal('flashDensityFactor', 1, 0.2)], correlations: [] } })
    const plan = planAssumptionDraws(set, { draws: 50, runSeed: 7 })
    const clustering = { maxFlashDensity: 30 } as never
    expect(() => siteYearDrawValues(battery(), plan, { runSeed: 7, years: 10, clustering })).toThrow(/storm clustering/)
  })
})
