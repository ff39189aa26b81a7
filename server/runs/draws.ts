// Runs with assumption draws: the draw plan (cached per thread: every site of a run shares it),
// each site's figures on common random numbers, and the packing of the per-evaluation series.
import type { AssumptionSet } from '../../shared/engine/assumptions'
import type { DrawPlan } from '../../shared/engine/draws'
import { planAssumptionDraws } from '../../shared/engine/draws'
import { DRAW_FLASHES_PER_SITE, siteDrawValues, summariseSiteDraws, type DrawMetric } from '../../shared/engine/draw-figures'
import type { SiteInput } from '../../shared/engine/types'
import type { SiteClustering } from '../../shared/engine/storm-clusters'
import { bandOf } from '../../shared/engine/draw-figures'
import { ratioSeries, siteYearDrawValues, yearDrawBands, type YearDrawFigures } from '../../shared/engine/year-draws'
import type { StoredSiteDraws, StoredTankDraws } from '../../shared/results/draws'

let cached: { key: string, plan: DrawPlan } | null = null

/** The run's plan: deterministic in (assumptions, K, seed), built once per thread. */
export function runDrawPlan(assumptions: AssumptionSet, draws: number, runSeed: number): DrawPlan {
  const key = JSON.stringify([draws, runSeed, assumptions])
  if (cached?.key !== key) cached = { key, plan: planAssumptionDraws(assumptions, { draws, runSeed }) }
  return cached.plan
}

/**
 * A series as base64 of Float32 (relative rounding 6e-8, far below any band's sampling error; half
 * the bytes of Float64: a run of 1,000 sites at K = 100 and 10 factors stores about 13 MB).
 */
export function encodeSeries(values: Float64Array): string {
  const f = Float32Array.from(values)
  return Buffer.from(f.buffer, f.byteOffset, f.byteLength).toString('base64')
}

/** The series back, as doubles; `length` values (the rest of the design is zero: direct strikes and sparking keep central + A only). */
export function decodeSeries(text: string, length: number): Float64Array {
  const f = decodeFloats(text)
  const out = new Float64Array(length)
  out.set(f.subarray(0, length))
  return out
}

/** The Float32 values of an encoded series, all of them. */
function decodeFloats(text: string): Float32Array {
  const bytes = Buffer.from(text, 'base64')
  const f = new Float32Array(bytes.byteLength / 4)
  new Uint8Array(f.buffer).set(bytes)
  return f
}

export interface SiteDraws { site: StoredSiteDraws, tanks: StoredTankDraws[] }

/** Bands and sensitivity of one site, anchored on its central figures (tank by tank). */
export function computeSiteDraws(site: SiteInput, assumptions: AssumptionSet, draws: number, runSeed: number, central: Record<DrawMetric, number>[]): SiteDraws {
  const plan = runDrawPlan(assumptions, draws, runSeed)
  const values = siteDrawValues(site, plan, { runSeed, samples: DRAW_FLASHES_PER_SITE })
  const s = summariseSiteDraws(values, central, plan, `${runSeed}|${site.id}`)
  return {
    site: {
      draws, bands: s.site, sensitivity: s.sensitivity, flashes: values.flashes,
      // The sensitivity indices are for expected fires and AAL: direct strikes and sparking keep the central value and the K band draws only.
      series: {
        direct: encodeSeries(s.series.direct.subarray(0, 1 + draws)), sparking: encodeSeries(s.series.sparking.subarray(0, 1 + draws)),
        ignition: encodeSeries(s.series.ignition), expectedAnnualLoss: encodeSeries(s.series.expectedAnnualLoss),
      },
    },
    tanks: s.tanks.map(bands => ({ draws, bands })),
  }
}

/**
 * Simulated-years runs: every band draw re-simulated on the central streams (year-draws.ts), the
 * site's four figures and its return-period losses as central × X_k / X_0. Sensitivity indices are
 * not computed for years runs (their design would cost another N·factors re-simulations, N = ⌊K/2⌋).
 */
export function computeSiteYearDraws(site: SiteInput, assumptions: AssumptionSet, draws: number, runSeed: number, years: number, clustering: SiteClustering | null, central: YearDrawFigures & { direct: number, sparking: number }): SiteDraws {
  const plan = runDrawPlan(assumptions, draws, runSeed)
  const v = siteYearDrawValues(site, plan, { runSeed, years, clustering })
  const E = v.evaluations
  // Per evaluation (central, then the K draws), the site's figure as the band uses it; where the
  // central re-simulation has no event (X_0 = 0) the re-simulated values themselves.
  const seriesOf = (c: number, pick: (f: YearDrawFigures) => number) => {
    const x = E.map(pick)
    const r = ratioSeries(c, x)
    const out = new Float64Array(E.length)
    out[0] = c
    for (let k = 1; k < E.length; k++) out[k] = r ? r[k - 1]! : x[k]!
    return out
  }
  const s = {
    direct: seriesOf(central.direct, f => f.direct ?? 0), sparking: seriesOf(central.sparking, f => f.sparking ?? 0),
    ignition: seriesOf(central.expectedFires, f => f.expectedFires), expectedAnnualLoss: seriesOf(central.averageAnnualLoss, f => f.averageAnnualLoss),
  }
  const band = (x: Float64Array) => bandOf(x.subarray(1))
  const bands = { direct: band(s.direct), sparking: band(s.sparking), ignition: band(s.ignition), expectedAnnualLoss: band(s.expectedAnnualLoss) }
  const quads: number[] = []
  v.tables.forEach((t, e) => {
    for (let y = 0; y < t.yearLosses.length; y++) if (t.yearLosses[y]! > 0) quads.push(e, y, t.yearLosses[y]!, t.yearMaxEventLoss[y]!)
  })
  return {
    site: {
      draws, bands, sensitivity: [], flashes: 0,
      series: { direct: encodeSeries(s.direct), sparking: encodeSeries(s.sparking), ignition: encodeSeries(s.ignition), expectedAnnualLoss: encodeSeries(s.expectedAnnualLoss) },
      years: yearDrawBands(v, central),
      yearTables: encodeSeries(Float64Array.from(quads)),
    },
    // Tanks: no bands in a years run (the re-simulation is per site; tank bands would cost a ratio per tank and figure).
    tanks: [],
  }
}

/** The quadruples of a site's re-simulated year tables back: (evaluation, year, year loss, largest event loss). */
export function decodeYearTables(text: string): Float64Array {
  return Float64Array.from(decodeFloats(text))
}
