// Runs with assumption draws: the draw plan (cached per thread: every site of a run shares it),
// each site's figures on common random numbers, and the packing of the per-evaluation series.
import type { AssumptionSet } from '../../shared/engine/assumptions'
import type { DrawPlan } from '../../shared/engine/draws'
import { planAssumptionDraws } from '../../shared/engine/draws'
import { DRAW_FLASHES_PER_SITE, siteDrawValues, summariseSiteDraws, type DrawMetric } from '../../shared/engine/draw-figures'
import type { SiteInput } from '../../shared/engine/types'
import type { StoredSiteDraws, StoredTankDraws } from '../../shared/results/draws'

let cached: { key: string, plan: DrawPlan } | null = null

/** The run's plan: deterministic in (assumptions, K, seed), built once per thread. */
export function runDrawPlan(assumptions: AssumptionSet, draws: number, runSeed: number): DrawPlan {
  const key = JSON.stringify([draws, runSeed, assumptions])
  if (cached?.key !== key) cached = { key, plan: planAssumptionDraws(assumptions, { draws, runSeed }) }
  return cached.plan
}

export function encodeSeries(values: Float64Array): string {
  return Buffer.from(values.buffer, values.byteOffset, values.byteLength).toString('base64')
}

export function decodeSeries(text: string): Float64Array {
  const bytes = Buffer.from(text, 'base64')
  const out = new Float64Array(bytes.byteLength / 8)
  new Uint8Array(out.buffer).set(bytes)
  return out
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
      series: { direct: encodeSeries(s.series.direct), sparking: encodeSeries(s.series.sparking), ignition: encodeSeries(s.series.ignition), expectedAnnualLoss: encodeSeries(s.series.expectedAnnualLoss) },
    },
    tanks: s.tanks.map(bands => ({ draws, bands })),
  }
}
