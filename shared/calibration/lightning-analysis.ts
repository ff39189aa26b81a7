// From the records near each site to its ground flash density and the current fit (MODEL.md §7).
import { estimateFlashDensity, type FlashDensityEstimate } from './flash-density'
import { CalibrationInputError } from './errors'
import { haversineKm } from './geo'
import { fitTruncatedLognormal, type LognormalFit } from './lognormal-fit'

/**
 * Strokes are grouped into flashes by the rule of the U.S. National Lightning Detection Network
 * (Cummins et al. 1998, J. Geophys. Res. 103(D8):9035): a stroke joins a flash when it comes within
 * 1 s of the flash's first stroke, within 0.5 s of the flash's latest stroke and within 10 km of the
 * first stroke; at most 15 strokes per flash.
 */
export const FLASH_GROUPING = { maxSpanMs: 1000, maxGapMs: 500, maxDistanceKm: 10, maxStrokes: 15 } as const

export interface NearbyStroke {
  /** Data-row number in the file (identifies the record across sites). */
  row: number
  timeMs: number
  latDeg: number
  lonDeg: number
  peakCurrentKa: number
  /** Distance from the site's reference point. */
  distanceKm: number
}

export type RecordsAre = 'flashes' | 'strokes'

/** First strokes of the flashes formed from ground strokes (any order in; time order inside). */
export function groupIntoFlashes(strokes: readonly NearbyStroke[]): NearbyStroke[] {
  const sorted = [...strokes].sort((a, b) => a.timeMs - b.timeMs || a.row - b.row)
  const firsts: NearbyStroke[] = []
  let open: { first: NearbyStroke, lastMs: number, count: number }[] = []
  for (const s of sorted) {
    open = open.filter(f => s.timeMs - f.first.timeMs <= FLASH_GROUPING.maxSpanMs)
    let joined: (typeof open)[number] | undefined
    let best = Infinity
    for (const f of open) {
      if (f.count >= FLASH_GROUPING.maxStrokes || s.timeMs - f.lastMs > FLASH_GROUPING.maxGapMs) continue
      const d = haversineKm(f.first.latDeg, f.first.lonDeg, s.latDeg, s.lonDeg)
      if (d <= FLASH_GROUPING.maxDistanceKm && d < best) { best = d; joined = f }
    }
    if (joined) { joined.lastMs = s.timeMs; joined.count++ }
    else { open.push({ first: s, lastMs: s.timeMs, count: 1 }); firsts.push(s) }
  }
  return firsts
}

export interface LightningOptions {
  radiusKm: number
  periodYears: number
  detectionEfficiency: number
  /** Network detection threshold for peak currents (kA); 0 when none is stated. */
  thresholdKa: number
  recordsAre: RecordsAre
}

export interface SiteLightningResult {
  siteId: string
  flashDensity: FlashDensityEstimate
  /** Negative first strokes within the radius, and those at or above the threshold (used in the fit). */
  negativeFirstStrokes: number
  fittedCurrents: number
  fit: LognormalFit | null
  fitProblem: string | null
}

export interface CurrentSample { row: number, currentKa: number }

/** Within-radius first strokes of one site: counted for Ng; negative ones give currents for the fit. */
export function analyseSite(siteId: string, strokes: readonly NearbyStroke[], options: LightningOptions): { result: SiteLightningResult, currents: CurrentSample[] } {
  const firsts = options.recordsAre === 'strokes' ? groupIntoFlashes(strokes) : strokes
  const inside = firsts.filter(s => s.distanceKm <= options.radiusKm)
  const flashDensity = estimateFlashDensity({ flashCount: inside.length, radiusKm: options.radiusKm, periodYears: options.periodYears, detectionEfficiency: options.detectionEfficiency })
  const negative = inside.filter(s => s.peakCurrentKa < 0)
  const currents = negative.map(s => ({ row: s.row, currentKa: -s.peakCurrentKa })).filter(c => c.currentKa >= options.thresholdKa)
  const { fit, problem } = tryFit(currents.map(c => c.currentKa), options.thresholdKa)
  return {
    result: { siteId, flashDensity, negativeFirstStrokes: negative.length, fittedCurrents: currents.length, fit, fitProblem: problem },
    currents,
  }
}

export function tryFit(currentsKa: readonly number[], thresholdKa: number): { fit: LognormalFit | null, problem: string | null } {
  try {
    return { fit: fitTruncatedLognormal(currentsKa, thresholdKa), problem: null }
  } catch (error) {
    if (error instanceof CalibrationInputError) return { fit: null, problem: error.message }
    throw error
  }
}

/** The same flash near two sites counts once in the pooled current fit. */
export function poolCurrents(perSite: readonly CurrentSample[][]): number[] {
  const byRow = new Map<number, number>()
  for (const list of perSite) for (const c of list) byRow.set(c.row, c.currentKa)
  return [...byRow.values()]
}

/**
 * Empirical exceedance P(I ≥ i | I ≥ T) of recorded currents at up to `maxPoints` plotting positions
 * (Weibull plotting position k/(n+1); common practice), for drawing against the fitted laws.
 */
export function empiricalExceedance(currentsKa: readonly number[], maxPoints = 300): [number, number][] {
  const sorted = [...currentsKa].sort((a, b) => a - b)
  const n = sorted.length
  if (n === 0) return []
  const stride = Math.max(1, Math.ceil(n / maxPoints))
  const points: [number, number][] = []
  for (let k = 0; k < n; k += stride) points.push([sorted[k]!, 1 - (k + 1) / (n + 1)])
  if ((n - 1) % stride !== 0) points.push([sorted[n - 1]!, 1 - n / (n + 1)])
  return points
}
