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
  /** Candidate flashes to average over (default 200 000). */
  samples?: number
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
}

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
  const rate = currentEdges.slice(1).map(() => new Float64Array(distanceEdges.length - 1))
  const directRate = new Float64Array(currentEdges.length - 1)
  const samples = options.samples ?? 200_000
  const weight = env.totalRate / samples
  const flash: Candidate = { x: 0, y: 0, currentKa: 0, lnI: 0, cell: 0 }
  for (let n = 0; n < samples; n++) {
    drawCandidate(ps, env, rand, flash)
    const band = bandIndex(currentEdges, flash.currentKa)
    if (band < 0) continue
    const attached = attachFlash(ps, flash.x, flash.y, strikeRadius(ps, flash.lnI))
    const w = weight / cellBoundOf(env, flash.cell)
    for (let t = 0; t < ps.nTanks; t++) {
      if (attached === t) { directRate[band]! += w; rate[band]![0]! += w; continue }
      if (!canSpark(ps, t, flash.currentKa)) continue
      const p = tankSparkGivenAttachment(ps, t, flash.currentKa, flash.lnI, attached, flash.x, flash.y)
      if (p <= 0) continue
      const qx = attached < 0 ? flash.x : ps.objX[attached]!
      const qy = attached < 0 ? flash.y : ps.objY[attached]!
      const d = bandIndex(distanceEdges, Math.hypot(qx - ps.objX[t]!, qy - ps.objY[t]!))
      if (d >= 0) rate[band]![d]! += w * p
    }
  }
  const total = rate.reduce((s, row) => s + row.reduce((a, b) => a + b, 0), 0)
  return {
    siteId: site.id, currentBandsKa: currentEdges, distanceBandsM: distanceEdges,
    ratePerYear: rate.map((row) => Array.from(row)),
    share: rate.map((row) => Array.from(row, (v) => (total > 0 ? v / total : 0))),
    directRatePerYear: Array.from(directRate),
    totalRatePerYear: total,
  }
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
