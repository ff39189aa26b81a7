// A storm window's flashes against an organisation's sites: a spatial grid index picks, per flash,
// the sites it can reach; the engine's storm functions (the runs' kernel averaged over the location
// error) give each tank's probabilities; flashes combine per tank as P(at least one).
// Framework-free, so the server, the tests and the benchmark run the same code.
import type { AssumptionSet } from '../engine/assumptions'
import type { PreparedSite } from '../engine/kernel'
import { prepareSite } from '../engine/kernel'
import { siteRelevantRadius } from '../engine/reach'
import {
  DEFAULT_STORM_QUADRATURE, degreesFor, eastNorthOf, flashTankProbabilities, type StormQuadrature,
} from '../engine/storm'
import type { SiteInput } from '../engine/types'
import { stormSiteLoss, stormSiteLossModel, type StormSiteLossModel } from './loss'

export interface StormSite { latDeg: number; lonDeg: number; input: SiteInput }

export interface StormFlashRecord {
  id: string
  latDeg: number
  lonDeg: number
  /** Signed, kA; the magnitude is used. */
  peakCurrentKa: number
  type: 'ground' | 'cloud'
  /** σ per axis, km; null: not stated (see `missingLocationErrorKm`). */
  locationErrorKm: number | null
}

export interface StormTankResult {
  siteId: string
  tankId: string
  direct: number
  sparking: number
  ignition: number
  drivingFlashId: string | null
  drivingIgnition: number
  /** Expected loss of a fire starting at the tank, its spread to neighbours included, split PD / BI. */
  fireLossPropertyDamage: number
  fireLossInterruption: number
}

export interface StormComputeOptions {
  quadrature?: StormQuadrature
  /** σ used for records that state no location error, km (default 0: the recorded point is taken as exact). */
  missingLocationErrorKm?: number
  /** Tanks whose three probabilities all stay below this are left out of the result (default 1e-9). */
  negligible?: number
  /** Grid cell edge, km (default 5). */
  cellKm?: number
}

/** Per site the window reached: its loss model (stored, so each reader's terms apply when read) and ground-up loss. */
export interface StormSiteResult {
  siteId: string
  lossModel: StormSiteLossModel
  /** E[Σ loss of the tanks that burn], spread included (closed form, shared/storms/loss.ts). */
  expectedGroundUpLoss: number
}

export interface StormComputation {
  tanks: StormTankResult[]
  sites: StormSiteResult[]
  groundFlashes: number
  cloudRecordsLeftOut: number
  /** Ground flashes that reached at least one site. */
  flashesNearSites: number
  /** Flash–site pairs evaluated after the index. */
  pairs: number
}

/** Currents at which the largest relevant radius over all sites is tabulated (log-spaced, kA). */
const REACH_CURRENTS = Array.from({ length: 61 }, (_, k) => Math.pow(10, k / 20)) // 1 kA … 1000 kA
const ERROR_REACH_SIGMAS = 11.3

/** Sites bucketed by grid cell of their reference point, and the largest reach over sites per current. */
export class StormSiteIndex {
  readonly prepared: PreparedSite[]
  private readonly cells = new Map<string, number[]>()
  private readonly cellDeg: number
  private readonly reachByCurrent: Float64Array

  constructor(readonly sites: readonly StormSite[], assumptions: AssumptionSet, cellKm = 5) {
    this.prepared = sites.map(s => prepareSite(s.input, assumptions))
    this.cellDeg = degreesFor(cellKm * 1000, 0).dLat
    sites.forEach((s, i) => {
      const key = this.key(Math.floor(s.latDeg / this.cellDeg), Math.floor(s.lonDeg / this.cellDeg))
      const list = this.cells.get(key)
      if (list) list.push(i)
      else this.cells.set(key, [i])
    })
    this.reachByCurrent = Float64Array.from(REACH_CURRENTS, (i) => {
      let r = 0
      for (const ps of this.prepared) r = Math.max(r, siteRelevantRadius(ps, i) + Math.hypot(ps.centreX, ps.centreY))
      return r
    })
  }

  private key(i: number, j: number): string { return `${i}:${j}` }

  /** Upper bound (m) on how far from a site's reference point a flash of this current can matter. */
  reachM(currentKa: number): number {
    for (let k = 0; k < REACH_CURRENTS.length; k++) if (REACH_CURRENTS[k]! >= currentKa) return this.reachByCurrent[k]!
    // Beyond the table: relevant radii grow at most linearly with the current (Rusk: y ∝ I).
    return this.reachByCurrent[REACH_CURRENTS.length - 1]! * currentKa / REACH_CURRENTS[REACH_CURRENTS.length - 1]!
  }

  /** Indices of the sites whose reference point lies within `radiusM` of the point (cells first, then exactly). */
  near(latDeg: number, lonDeg: number, radiusM: number, out: number[]): number[] {
    out.length = 0
    const { dLat, dLon } = degreesFor(radiusM, Math.min(89.9, Math.abs(latDeg) + degreesFor(radiusM, 0).dLat))
    const i0 = Math.floor((latDeg - dLat) / this.cellDeg), i1 = Math.floor((latDeg + dLat) / this.cellDeg)
    const wide = dLon >= 180
    const j0 = wide ? Math.floor(-180 / this.cellDeg) : Math.floor((lonDeg - dLon) / this.cellDeg)
    const j1 = wide ? Math.floor(180 / this.cellDeg) : Math.floor((lonDeg + dLon) / this.cellDeg)
    const r2 = radiusM * radiusM
    const lonCells = Math.round(360 / this.cellDeg)
    for (let i = i0; i <= i1; i++) {
      for (let j = j0; j <= j1; j++) {
        // Wrap across the ±180° meridian.
        const jj = ((j + Math.floor(lonCells / 2)) % lonCells + lonCells) % lonCells - Math.floor(lonCells / 2)
        const list = this.cells.get(this.key(i, jj))
        if (!list) continue
        for (const s of list) {
          const site = this.sites[s]!
          const p = eastNorthOf(site.latDeg, site.lonDeg, latDeg, lonDeg)
          if (p.eastM * p.eastM + p.northM * p.northM <= r2) out.push(s)
        }
      }
    }
    return out
  }
}

/** Every tank's probabilities for one window's flashes. */
export function computeStormWindow(index: StormSiteIndex, flashes: readonly StormFlashRecord[], options: StormComputeOptions = {}): StormComputation {
  const quadrature = options.quadrature ?? DEFAULT_STORM_QUADRATURE
  const missingSigmaM = (options.missingLocationErrorKm ?? 0) * 1000
  const negligible = options.negligible ?? 1e-9
  const perSite = index.prepared.map(ps => ({
    noDirect: new Float64Array(ps.nTanks).fill(1), noSpark: new Float64Array(ps.nTanks).fill(1), noIgnition: new Float64Array(ps.nTanks).fill(1),
    driver: new Array<string | null>(ps.nTanks).fill(null), driverP: new Float64Array(ps.nTanks), touched: false,
  }))
  let groundFlashes = 0, cloud = 0, nearSites = 0, pairs = 0
  const candidates: number[] = []
  for (const f of flashes) {
    if (f.type !== 'ground') { cloud++; continue }
    groundFlashes++
    const current = Math.abs(f.peakCurrentKa)
    const sigmaM = f.locationErrorKm === null ? missingSigmaM : f.locationErrorKm * 1000
    index.near(f.latDeg, f.lonDeg, index.reachM(current) + ERROR_REACH_SIGMAS * sigmaM, candidates)
    let reached = false
    for (const s of candidates) {
      pairs++
      const site = index.sites[s]!
      const ps = index.prepared[s]!
      const { eastM, northM } = eastNorthOf(site.latDeg, site.lonDeg, f.latDeg, f.lonDeg)
      const p = flashTankProbabilities(ps, { eastM, northM, currentKa: current, sigmaM }, quadrature)
      const acc = perSite[s]!
      for (let t = 0; t < ps.nTanks; t++) {
        const ig = p.ignition[t]!
        if (p.direct[t]! === 0 && p.sparking[t]! === 0) continue
        reached = true
        acc.touched = true
        acc.noDirect[t]! *= 1 - p.direct[t]!
        acc.noSpark[t]! *= 1 - p.sparking[t]!
        acc.noIgnition[t]! *= 1 - ig
        if (ig > acc.driverP[t]!) { acc.driverP[t] = ig; acc.driver[t] = f.id }
      }
    }
    if (reached) nearSites++
  }
  const tanks: StormTankResult[] = []
  const sites: StormSiteResult[] = []
  index.prepared.forEach((ps, s) => {
    const acc = perSite[s]!
    if (!acc.touched) return
    const lossModel = stormSiteLossModel(ps, Float64Array.from(acc.noIgnition, none => 1 - none), negligible)
    // Every site the flashes reached, even when none of its tanks can burn (an empty model), so a
    // reader can tell "computed: nothing can burn" from a window computed before site losses were kept.
    sites.push({ siteId: ps.siteId, lossModel, expectedGroundUpLoss: stormSiteLoss(lossModel, null, { window: '', site: ps.siteId }).groundUp.total })
    for (let t = 0; t < ps.nTanks; t++) {
      const direct = 1 - acc.noDirect[t]!, sparking = 1 - acc.noSpark[t]!, ignition = 1 - acc.noIgnition[t]!
      if (direct < negligible && sparking < negligible && ignition < negligible) continue
      const own = ps.expectedLoss[t]!
      // The fire's expected loss with spread (kernel severity), split PD / BI as the tank's own loss is.
      const scale = own.total > 0 ? ps.severity[t]! / own.total : 0
      tanks.push({
        siteId: ps.siteId, tankId: ps.tanks[t]!.id, direct, sparking, ignition, drivingFlashId: acc.driver[t]!, drivingIgnition: acc.driverP[t]!,
        fireLossPropertyDamage: own.propertyDamage * scale, fireLossInterruption: own.businessInterruption * scale,
      })
    }
  })
  tanks.sort((x, y) => y.ignition - x.ignition || (x.tankId < y.tankId ? -1 : 1))
  return { tanks, sites, groundFlashes, cloudRecordsLeftOut: cloud, flashesNearSites: nearSites, pairs }
}

/**
 * Expected fires (Σ P(ignition) over the tanks the flashes reach) and expected ground-up loss (Σ over
 * sites of E[Σ loss of the burning tanks], spread included) of a window.
 */
export function windowTotals(result: Pick<StormComputation, 'tanks' | 'sites'>): { expectedFires: number; expectedGroundUpLoss: number } {
  let fires = 0, loss = 0
  for (const t of result.tanks) fires += t.ignition
  for (const s of result.sites) loss += s.expectedGroundUpLoss
  return { expectedFires: fires, expectedGroundUpLoss: loss }
}
