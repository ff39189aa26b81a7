// Heat-map data: a tank's sparking probability over stroke current × distance, and a site's share
// of events by current band and distance band (PRODUCT.md, "Looking").
import type { SiteInput, TankInput } from './types'
import type { AssumptionSet } from './assumptions'
import type { Candidate } from './envelope'
import type { PreparedSite } from './kernel'
import { attachFlash, canSpark, prepareSite, strikeRadius, tankSparkGivenAttachment } from './kernel'
import { cellBoundOf, drawCandidate } from './envelope'
import type { SitePreparation } from './prepared'
import { prepareSiteOnce } from './prepared'
import { createStream } from './random'
import { siteRadius, siteRelevantRadius } from './reach'

export interface HeatmapGrid { currentsKa?: number[]; distancesM?: number[]; directions?: number }

export interface TankHeatmap {
  tankId: string
  currentsKa: number[]
  /** Horizontal distance of the flash (the leader's ground point) from the tank's axis. */
  distancesM: number[]
  /** sparkingProbability[i][j]: current i, distance j, averaged over the directions around the tank. */
  sparkingProbability: number[][]
  /** Share of directions in which the flash attaches to the tank itself (a direct strike). */
  directShare: number[][]
  /** Direct-strike zone: the flash attaches to the tank in at least half of the directions. */
  directZone: boolean[][]
  /** Ignition probability per flash: direct share × P(ign | direct) + sparking × P(ign | spark). */
  ignitionProbability: number[][]
}

export function logSpace(from: number, to: number, count: number): number[] {
  if (count === 1) return [from]
  return Array.from({ length: count }, (_, k) => from * Math.pow(to / from, k / (count - 1)))
}

/**
 * Sparking probability of `tank` over a current × distance grid. With a site, the tank stands
 * among the site's other tanks and structures (the given tank replaces the site's tank of the same
 * id, so a what-if edit is seen) and each cell averages over directions; without, it stands alone.
 */
export function tankSparkingHeatmap(tank: TankInput, site: SiteInput | null, assumptions: AssumptionSet, grid: HeatmapGrid = {}): TankHeatmap {
  const others = site ? site.tanks.filter((t) => t.id !== tank.id) : []
  const layout: SiteInput = { id: site?.id ?? 'isolated', name: site?.name ?? '', flashDensity: site?.flashDensity ?? 0, tanks: [tank, ...others], structures: site?.structures ?? [] }
  const ps = prepareSite(layout, assumptions)
  const currents = grid.currentsKa ?? logSpace(assumptions.currentMinKa, assumptions.currentMaxKa, 24)
  const reach = siteRelevantRadius(ps, assumptions.currentMaxKa)
  const distances = grid.distancesM ?? logSpace(Math.max(1, tank.diameterM / 2), Math.max(reach, 10), 30)
  const directions = ps.nObjects > 1 ? (grid.directions ?? 24) : 1
  const rows = currents.map((current) => heatmapRow(ps, current, distances, directions))
  return {
    tankId: tank.id, currentsKa: currents, distancesM: distances,
    sparkingProbability: rows.map((r) => r.sparking),
    directShare: rows.map((r) => r.direct),
    directZone: rows.map((r) => r.direct.map((share) => share >= 0.5)),
    ignitionProbability: rows.map((r) => r.sparking.map((p, j) => r.direct[j]! * ps.pIgnDirect[0]! + p * ps.pIgnSpark[0]!)),
  }
}

function heatmapRow(ps: PreparedSite, current: number, distances: number[], directions: number): { sparking: number[]; direct: number[] } {
  const lnI = Math.log(current)
  const rs = strikeRadius(ps, lnI)
  const sparking: number[] = []
  const direct: number[] = []
  for (const distance of distances) {
    let p = 0
    let hits = 0
    for (let k = 0; k < directions; k++) {
      const theta = 2 * Math.PI * (k + 0.5) / directions
      const px = ps.objX[0]! + distance * Math.cos(theta)
      const py = ps.objY[0]! + distance * Math.sin(theta)
      const attached = attachFlash(ps, px, py, rs)
      if (attached === 0) hits += 1
      else p += tankSparkGivenAttachment(ps, 0, current, lnI, attached, px, py)
    }
    sparking.push(p / directions)
    direct.push(hits / directions)
  }
  return { sparking, direct }
}

export interface SiteEventBandOptions {
  runSeed: number | string
  /** Candidate flashes to average over (default 200 000); with `precision`, the most it draws. */
  samples?: number
  /**
   * Stop once the picture is as precise as stated: after every batch (from `minSamples` on), the
   * standard error of every cell's rate — from the spread of the batches' own estimates — is at
   * most `shareSe` × the site's total event rate, and the total's relative standard error at most
   * `totalRse`. A site without any event so far draws on up to `samples`.
   */
  precision?: { shareSe: number; totalRse: number; minSamples: number; batch: number }
  currentBandsKa?: number[]
  distanceBandsM?: number[]
}

export interface SiteEventBands {
  siteId: string
  /** Band edges; the last distance edge is the site radius R. */
  currentBandsKa: number[]
  distanceBandsM: number[]
  /** Tank events per year (direct strikes + sparking) by current band × band of the attachment point's distance to the tank. */
  ratePerYear: number[][]
  /** The same as shares of all events (sums to 1 when there are any). */
  share: number[][]
  /** Of which direct strikes (distance 0), by current band. */
  directRatePerYear: number[]
  totalRatePerYear: number
  /** Candidate flashes drawn (absent in heat maps stored before engine 2.4.0: 40,000 each). */
  samples?: number
  /** Largest standard error of a cell's rate as a share of the total event rate (absent before engine 2.4.0). */
  largestShareSe?: number
}

/**
 * Candidate flashes behind each site's event-band heatmap (a picture, not a headline figure): in
 * batches of 1,000, from 8,000 on, until every cell's rate has a standard error of at most 0.5 % of
 * the site's total event rate and the total a relative standard error of at most 2 %; at most 40,000.
 */
export const RUN_EVENT_BANDS: Pick<SiteEventBandOptions, 'samples' | 'precision'> = { samples: 40_000, precision: { shareSe: 0.005, totalRse: 0.02, minSamples: 8_000, batch: 1_000 } }

/**
 * Where a site's events come from: expected tank events per year by current band and distance
 * band, from candidate flashes of the thinning envelope weighted by their conditional event
 * probabilities (no coin flips), so the shares are smooth with a modest sample.
 */
export function siteEventBands(site: SiteInput, assumptions: AssumptionSet, options: SiteEventBandOptions, prepared: SitePreparation = prepareSiteOnce(site, assumptions)): SiteEventBands {
  const ps = prepared.ps
  const env = prepared.envelope()
  const rand = createStream(options.runSeed, site.id, 'event-bands')
  const currentEdges = options.currentBandsKa ?? defaultCurrentBands(assumptions)
  const distanceEdges = options.distanceBandsM ?? [0, 25, 50, 100, 200, 500, 1000, 2000].filter((d) => d < siteRadius(ps)).concat([siteRadius(ps)])
  const nCurrent = currentEdges.length - 1
  const nDistance = distanceEdges.length - 1
  const cells = nCurrent * nDistance
  const maxSamples = options.samples ?? 200_000
  const precision = options.precision
  const batch = precision ? Math.max(1, Math.floor(precision.batch)) : maxSamples
  // Sums of each batch's contributions (flat current × distance cells), without the weight factor.
  const batchSum = new Float64Array(cells)
  const batchDirect = new Float64Array(nCurrent)
  const sum = new Float64Array(cells), sumSq = new Float64Array(cells), sumDirect = new Float64Array(nCurrent)
  const cross = new Float64Array(cells) // Σ_b cell_b · total_b
  let totalSumSq = 0
  let batches = 0
  let drawn = 0
  const flash: Candidate = { x: 0, y: 0, currentKa: 0, lnI: 0, cell: 0 }
  while (drawn < maxSamples) {
    const size = Math.min(batch, maxSamples - drawn)
    batchSum.fill(0)
    batchDirect.fill(0)
    for (let n = 0; n < size; n++) {
      drawCandidate(ps, env, rand, flash)
      const band = bandIndex(currentEdges, flash.currentKa)
      if (band < 0) continue
      const attached = attachFlash(ps, flash.x, flash.y, strikeRadius(ps, flash.lnI))
      const w = 1 / cellBoundOf(env, flash.cell)
      const row = band * nDistance
      for (let t = 0; t < ps.nTanks; t++) {
        if (attached === t) { batchDirect[band]! += w; batchSum[row]! += w; continue }
        if (!canSpark(ps, t, flash.currentKa)) continue
        const p = tankSparkGivenAttachment(ps, t, flash.currentKa, flash.lnI, attached, flash.x, flash.y)
        if (p <= 0) continue
        const qx = attached < 0 ? flash.x : ps.objX[attached]!
        const qy = attached < 0 ? flash.y : ps.objY[attached]!
        const d = bandIndex(distanceEdges, Math.hypot(qx - ps.objX[t]!, qy - ps.objY[t]!))
        if (d >= 0) batchSum[row + d]! += w * p
      }
    }
    drawn += size
    batches += 1
    let batchTotal = 0
    for (let c = 0; c < cells; c++) batchTotal += batchSum[c]!
    for (let c = 0; c < cells; c++) {
      sum[c]! += batchSum[c]!
      sumSq[c]! += batchSum[c]! * batchSum[c]!
      cross[c]! += batchSum[c]! * batchTotal
    }
    for (let b = 0; b < nCurrent; b++) sumDirect[b]! += batchDirect[b]!
    totalSumSq += batchTotal * batchTotal
    if (!precision || drawn < precision.minSamples || batches < 2 || size < batch) continue
    const check = batchPrecision(sum, sumSq, cross, totalSumSq, batches)
    if (check.total > 0 && check.largestShareSe <= precision.shareSe && check.totalRse <= precision.totalRse) break
  }
  // The precision of what was drawn (the same sums the last check read when the rule stopped it).
  const largestShareSe = precision && batches >= 2 ? batchPrecision(sum, sumSq, cross, totalSumSq, batches).largestShareSe : 0
  const weight = env.totalRate / drawn
  const rate = Array.from({ length: nCurrent }, (_, b) => Array.from(sum.subarray(b * nDistance, (b + 1) * nDistance), (v) => v * weight))
  const total = rate.reduce((s, row) => s + row.reduce((a, b) => a + b, 0), 0)
  return {
    siteId: site.id, currentBandsKa: currentEdges, distanceBandsM: distanceEdges,
    ratePerYear: rate,
    share: rate.map((row) => row.map((v) => (total > 0 ? v / total : 0))),
    directRatePerYear: Array.from(sumDirect, (v) => v * weight),
    totalRatePerYear: total,
    ...(precision ? { samples: drawn, largestShareSe } : {}),
  }
}

/**
 * Precision of the pooled estimate from B equal batches (batch means; a ratio estimator for the
 * shares: se(ŝ_c)² ≈ Σ_b (x_cb − ŝ_c·t_b)² / (B(B−1)·t̄²), Cochran 1977, "Sampling Techniques", §6.4).
 */
function batchPrecision(sum: Float64Array, sumSq: Float64Array, cross: Float64Array, totalSumSq: number, batches: number): { total: number; totalRse: number; largestShareSe: number } {
  let total = 0
  for (let c = 0; c < sum.length; c++) total += sum[c]!
  if (total <= 0) return { total: 0, totalRse: Infinity, largestShareSe: 0 }
  const meanTotal = total / batches
  const totalVar = Math.max(0, (totalSumSq - batches * meanTotal * meanTotal) / (batches - 1))
  let largest = 0
  for (let c = 0; c < sum.length; c++) {
    const share = sum[c]! / total
    // Σ_b (x_cb − s·t_b)² expanded over the running sums.
    const ss = Math.max(0, sumSq[c]! - 2 * share * cross[c]! + share * share * totalSumSq)
    const se = Math.sqrt(ss / (batches * (batches - 1))) / meanTotal
    if (se > largest) largest = se
  }
  return { total, totalRse: Math.sqrt(totalVar / batches) / meanTotal, largestShareSe: largest }
}

function defaultCurrentBands(a: AssumptionSet): number[] {
  const inner = [5, 10, 20, 30, 50, 100, 200].filter((i) => i > a.currentMinKa && i < a.currentMaxKa)
  return [a.currentMinKa, ...inner, a.currentMaxKa]
}

/** Index of the band [edges[k], edges[k+1]) holding x (the last band is closed); −1 outside. */
function bandIndex(edges: readonly number[], x: number): number {
  if (x < edges[0]! || x > edges[edges.length - 1]!) return -1
  for (let k = 0; k < edges.length - 1; k++) if (x < edges[k + 1]!) return k
  return edges.length - 2
}
