import { describe, expect, it } from 'vitest'
import jStat from 'jstat'
import { CalibrationInputError, fitProbit, upAndDown, type ImpulseApplication } from '../../../shared/calibration'
import { normal, rng } from './synthetic'

const N = false
const S = true
/** A 22-application up-and-down series with a 2 kV step, worked out by hand below. */
const HAND_SERIES: ImpulseApplication[] = ([
  [90, N], [92, N], [94, S], [92, N], [94, S], [92, S], [90, N], [92, N], [94, S], [92, N], [94, N],
  [96, S], [94, S], [92, N], [94, S], [92, N], [94, S], [92, S], [90, N], [92, N], [94, S], [92, N],
] as const).map(([levelKv, spark]) => ({ levelKv, spark }))

describe('up-and-down method (IEC 60060-1)', () => {
  it('averages the levels from the first change of response on', () => {
    // By hand: the response first changes at application 3 (94 kV, spark after no spark at 92 kV),
    // so applications 1–2 are discarded and 20 remain: 90 kV ×2, 92 kV ×9, 94 kV ×8, 96 kV ×1.
    // U50 = (2·90 + 9·92 + 8·94 + 96) / 20 = 1856 / 20 = 92.8 kV (IEC 60060-1: Σ kᵢUᵢ / Σ kᵢ).
    const r = upAndDown(HAND_SERIES)
    expect(r.discarded).toBe(2)
    expect(r.useful).toBe(20)
    expect(r.stepKv).toBe(2)
    expect(r.u50Kv).toBeCloseTo(92.8, 10)
    expect(r.levels).toEqual([
      { levelKv: 90, applications: 2, sparks: 0 },
      { levelKv: 92, applications: 9, sparks: 2 },
      { levelKv: 94, applications: 8, sparks: 7 },
      { levelKv: 96, applications: 1, sparks: 1 },
    ])
    // A 2 kV step is 2.2 % of 92.8 kV, inside IEC 60060-1's recommended 1.5–3 %: no warning.
    expect(r.warnings).toEqual([])
  })

  it('requires enough useful applications and says how many more', () => {
    // IEC 60060-1: at least 20 useful applications for U50 (from memory); 12 here.
    const short = HAND_SERIES.slice(0, 14)
    expect(() => upAndDown(short)).toThrow(CalibrationInputError)
    expect(() => upAndDown(short)).toThrow('Only 12 useful applications after the first change of response (application 3); the up-and-down method needs at least 20 (IEC 60060-1). Apply 8 more.')
  })

  it('refuses a series that is not up-and-down, never changes, has uneven steps or is empty', () => {
    expect(() => upAndDown([])).toThrow(/series is empty/)
    const wrongWay = HAND_SERIES.map(a => ({ ...a }))
    wrongWay[5] = { levelKv: 96, spark: true } // after the spark at 94 kV the level went up
    expect(() => upAndDown(wrongWay)).toThrow(/Application 6: after the spark at 94 kV the next level must be one step lower/)
    const never = Array.from({ length: 25 }, (_, i) => ({ levelKv: 50 + 2 * i, spark: false }))
    expect(() => upAndDown(never)).toThrow(/never changed/)
    const uneven = HAND_SERIES.map(a => ({ ...a }))
    uneven[1] = { levelKv: 95, spark: false } // 90 → 95: a 5 kV step in a 2 kV series
    uneven[2] = { levelKv: 97, spark: true }
    expect(() => upAndDown(uneven)).toThrow(/constant step/)
  })

  it('warns when the step is outside the recommended 1.5–3 % of U50', () => {
    const coarse = HAND_SERIES.map(a => ({ levelKv: 50 + (a.levelKv - 90) * 5, spark: a.spark })) // 10 kV steps around 64 kV
    expect(upAndDown(coarse).warnings[0]).toMatch(/recommends about 1.5 % to 3 %/)
  })
})

/** Log-likelihood of the probit model written with jstat's normal cdf. */
function jstatLogLikelihood(series: readonly ImpulseApplication[], u50: number, sigma: number): number {
  return series.reduce((t, a) => {
    const p = jStat.normal.cdf(Math.log(a.levelKv / u50) / sigma, 0, 1)
    return t + Math.log(a.spark ? p : 1 - p)
  }, 0)
}

function simulateSeries(seed: string, u50: number, sigma: number, levels: number[], perLevel: number): ImpulseApplication[] {
  const r = rng(seed)
  const out: ImpulseApplication[] = []
  // Each application sparks when the level exceeds that application's own threshold, log-normal
  // about U50 (the model of MODEL.md §4).
  for (const levelKv of levels) for (let k = 0; k < perLevel; k++) out.push({ levelKv, spark: levelKv >= u50 * Math.exp(sigma * normal(r)) })
  return out
}

describe('maximum likelihood on the probit (log-normal) model', () => {
  const levels = [70, 75, 80, 85, 90, 95, 100, 105, 110]

  it('reports the maximum of the likelihood written with jstat', () => {
    const series = simulateSeries('probit-one', 90, 0.1, levels, 12)
    const f = fitProbit(series)
    const ll = jstatLogLikelihood(series, f.u50Kv, f.sigma)
    expect(f.logLikelihood).toBeCloseTo(ll, 5)
    const h = 1e-5
    const gU = (jstatLogLikelihood(series, f.u50Kv * (1 + h), f.sigma) - jstatLogLikelihood(series, f.u50Kv * (1 - h), f.sigma)) / (2 * h)
    const gS = (jstatLogLikelihood(series, f.u50Kv, f.sigma + h) - jstatLogLikelihood(series, f.u50Kv, f.sigma - h)) / (2 * h)
    expect(Math.abs(gU)).toBeLessThan(1e-3)
    expect(Math.abs(gS)).toBeLessThan(1e-3)
    for (const [du, ds] of [[1.01, 0], [0.99, 0], [1, 0.005], [1, -0.005]]) {
      expect(jstatLogLikelihood(series, f.u50Kv * du!, f.sigma + ds!)).toBeLessThan(ll)
    }
  })

  it('recovers U50 and σ within their intervals in about 95 % of repeated test series', () => {
    const trials = 200
    let u50Covered = 0
    let sigmaCovered = 0
    for (let seed = 0; seed < trials; seed++) {
      const f = fitProbit(simulateSeries(`probit-${seed}`, 90, 0.1, levels, 12))
      if (f.u50Interval.lo <= 90 && 90 <= f.u50Interval.hi) u50Covered++
      if (f.sigmaInterval.lo <= 0.1 && 0.1 <= f.sigmaInterval.hi) sigmaCovered++
    }
    // Nominal 95 %, less a Monte Carlo allowance of ~2.5 binomial SE (1.5 %) and the Wald
    // interval's small-sample shortfall for σ (common practice).
    expect(u50Covered / trials).toBeGreaterThanOrEqual(0.91)
    expect(u50Covered / trials).toBeLessThanOrEqual(0.99)
    expect(sigmaCovered / trials).toBeGreaterThanOrEqual(0.89)
    expect(sigmaCovered / trials).toBeLessThanOrEqual(0.99)
  })

  it('fits the hand-worked up-and-down series near its up-and-down U50', () => {
    const f = fitProbit(HAND_SERIES)
    // Both estimate the same 50 % level; with 22 applications they agree within the ML interval (common practice).
    expect(f.u50Interval.lo).toBeLessThan(92.8)
    expect(f.u50Interval.hi).toBeGreaterThan(92.8)
  })

  it('explains why it cannot fit separated or one-sided data', () => {
    expect(() => fitProbit([])).toThrow(/series is empty/)
    expect(() => fitProbit([{ levelKv: 80, spark: true }, { levelKv: 90, spark: true }])).toThrow(/needs both outcomes/)
    const separated = [{ levelKv: 80, spark: false }, { levelKv: 85, spark: false }, { levelKv: 90, spark: true }, { levelKv: 95, spark: true }]
    expect(() => fitProbit(separated)).toThrow(/do not overlap/)
  })
})
