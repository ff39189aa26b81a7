// After the storm (PRODUCT.md §15): recorded flashes turned into each tank's probability of a direct
// strike, of induced sparking and of ignition. The physics is the runs' kernel — attachFlash,
// the sparking tables and the ignition factors of a PreparedSite — evaluated at the recorded
// location and averaged over the location error; nothing here is a second model.
//
// Convention for the location error: a record's `location_error_km` is read as σ, the standard
// deviation of a circular bivariate normal error, per axis (east and north alike, independent).
// The distance between the true and the recorded point is then Rayleigh-distributed with scale σ
// (median 1.177 σ). A provider that reports the semi-major axis of its 50 % confidence ellipse
// gives a value 1.177 times σ for a circular error; divide by 1.177 before upload to follow this
// convention exactly (README "After the storm").
import type { PreparedSite } from './kernel'
import { attachFlash, siteEventProbabilities, strikeRadius } from './kernel'
import { siteRelevantRadius } from './reach'

/** A flash in the site's own frame: metres east and north of the site's reference point. */
export interface StormFlashAtSite {
  eastM: number
  northM: number
  /** Peak-current magnitude, kA (the sign of the recorded current is polarity, not strength). */
  currentKa: number
  /** σ of the circular Gaussian location error, per axis, m (0: the location is taken as exact). */
  sigmaM: number
}

/** Per tank of the site, probabilities for one flash (index = tank index of the PreparedSite). */
export interface FlashTankProbabilities {
  /** P(the flash attaches to the tank). */
  direct: Float64Array
  /** P(the flash does not strike the tank and induces a spark inside it). */
  sparking: Float64Array
  /** P(ignition) = P(direct)·p(ign | direct) + P(sparking)·p(ign | spark), both factors the run's. */
  ignition: Float64Array
}

/**
 * Resolution of the error integral: `rings` annuli of equal probability (Rayleigh quantiles at the
 * midpoints), `spokes` directions each, staggered ring by ring; `rings`·`spokes` nodes of equal
 * weight. The error is that of a midpoint rule on an indicator: at most the mass of the cells a
 * capture-zone boundary cuts, about 2/rings + 2/spokes per boundary, much less in practice (the
 * sparking terms are smooth). The reference tests hold it to a brute-force quadrature.
 */
export interface StormQuadrature { rings: number; spokes: number }
export const DEFAULT_STORM_QUADRATURE: StormQuadrature = { rings: 48, spokes: 48 }

/** Beyond this many σ the normal error's mass is below 1.6e-28 (Rayleigh tail exp(−r²/2σ²)). */
const ERROR_REACH_SIGMAS = 11.3

/** How far (m) from the site's reference point a flash of current I can still matter, location error included. */
export function stormReachM(ps: PreparedSite, currentKa: number, sigmaM: number): number {
  return siteRelevantRadius(ps, currentKa) + ERROR_REACH_SIGMAS * sigmaM
}

/**
 * Every tank's direct-strike, sparking and ignition probabilities for one recorded flash. With
 * σ = 0 the flash is evaluated at the recorded point exactly as a run evaluates a sampled flash.
 */
export function flashTankProbabilities(ps: PreparedSite, flash: StormFlashAtSite, quadrature: StormQuadrature = DEFAULT_STORM_QUADRATURE): FlashTankProbabilities {
  const nT = ps.nTanks
  const out: FlashTankProbabilities = { direct: new Float64Array(nT), sparking: new Float64Array(nT), ignition: new Float64Array(nT) }
  const current = flash.currentKa
  if (!(current > 0) || nT === 0) return out
  const lnI = Math.log(current)
  const rs = strikeRadius(ps, lnI)
  const px0 = flash.eastM - ps.centreX
  const py0 = flash.northM - ps.centreY
  const reach = siteRelevantRadius(ps, current)
  const scratch = new Float64Array(nT)
  if (!(flash.sigmaM > 0)) {
    if (px0 * px0 + py0 * py0 < reach * reach) accumulate(ps, current, lnI, rs, px0, py0, 1, scratch, out)
    finishIgnition(ps, out)
    return out
  }
  const sigma = flash.sigmaM
  const centreDistance = Math.hypot(px0, py0)
  if (centreDistance - ERROR_REACH_SIGMAS * sigma > reach) return out
  const { rings, spokes } = quadrature
  const weight = 1 / (rings * spokes)
  const reach2 = reach * reach
  for (let k = 0; k < rings; k++) {
    const u = (k + 0.5) / rings
    const rho = sigma * Math.sqrt(-2 * Math.log(1 - u))
    // The whole ring misses the site's relevant disc: nothing on it can matter.
    if (rho - centreDistance > reach || centreDistance - rho > reach) continue
    const offset = (k % 2) * 0.5
    for (let m = 0; m < spokes; m++) {
      const theta = (2 * Math.PI * (m + offset)) / spokes
      const px = px0 + rho * Math.cos(theta)
      const py = py0 + rho * Math.sin(theta)
      if (px * px + py * py >= reach2) continue
      accumulate(ps, current, lnI, rs, px, py, weight, scratch, out)
    }
  }
  finishIgnition(ps, out)
  return out
}

/** One node: attach as a run does, then weight the struck tank's 1 and the others' sparking probabilities. */
function accumulate(ps: PreparedSite, current: number, lnI: number, rs: number, px: number, py: number, weight: number, scratch: Float64Array, out: FlashTankProbabilities): void {
  const attached = attachFlash(ps, px, py, rs)
  siteEventProbabilities(ps, current, lnI, attached, px, py, scratch)
  for (let t = 0; t < ps.nTanks; t++) {
    if (attached === t) out.direct[t]! += weight
    else out.sparking[t]! += weight * scratch[t]!
  }
}

function finishIgnition(ps: PreparedSite, out: FlashTankProbabilities): void {
  for (let t = 0; t < ps.nTanks; t++) {
    out.direct[t] = Math.min(1, out.direct[t]!)
    out.sparking[t] = Math.min(1, out.sparking[t]!)
    out.ignition[t] = out.direct[t]! * ps.pIgnDirect[t]! + out.sparking[t]! * ps.pIgnSpark[t]!
  }
}

/** P(at least one) over independent flashes: 1 − Π(1 − p_f). */
export function atLeastOnce(probabilities: Iterable<number>): number {
  let none = 1
  for (const p of probabilities) none *= 1 - p
  return 1 - none
}

/** What a storm window did to one tank: the flashes combined, and the flash that drives the ignition. */
export interface StormTankOutcome {
  tankIndex: number
  direct: number
  sparking: number
  ignition: number
  /** Index (in the given flash list) of the flash with the largest ignition probability; −1 if none matters. */
  drivingFlash: number
  drivingIgnition: number
}

/**
 * All flashes of one window against one site: per tank P(at least one direct strike), P(at least
 * one spark) and P(at least one ignition), flashes taken as independent, and the driving flash.
 */
export function stormSiteOutcome(ps: PreparedSite, flashes: readonly StormFlashAtSite[], quadrature: StormQuadrature = DEFAULT_STORM_QUADRATURE): StormTankOutcome[] {
  const nT = ps.nTanks
  const noDirect = new Float64Array(nT).fill(1)
  const noSpark = new Float64Array(nT).fill(1)
  const noIgnition = new Float64Array(nT).fill(1)
  const driver = new Int32Array(nT).fill(-1)
  const driverP = new Float64Array(nT)
  flashes.forEach((flash, f) => {
    const p = flashTankProbabilities(ps, flash, quadrature)
    for (let t = 0; t < nT; t++) {
      noDirect[t]! *= 1 - p.direct[t]!
      noSpark[t]! *= 1 - p.sparking[t]!
      noIgnition[t]! *= 1 - p.ignition[t]!
      if (p.ignition[t]! > driverP[t]!) { driverP[t] = p.ignition[t]!; driver[t] = f }
    }
  })
  return Array.from({ length: nT }, (_, t) => ({
    tankIndex: t, direct: 1 - noDirect[t]!, sparking: 1 - noSpark[t]!, ignition: 1 - noIgnition[t]!,
    drivingFlash: driver[t]!, drivingIgnition: driverP[t]!,
  }))
}

/** Mean Earth radius, km (IUGG), the same as the calibration's haversine distances. */
const EARTH_RADIUS_M = 6_371_008.8
const RAD = Math.PI / 180

/**
 * A recorded point in a site's frame: metres east and north of the site's reference point, on the
 * local tangent plane (equirectangular about the site's latitude). Within the few kilometres a
 * flash can matter over, this differs from the great-circle distance by far less than the
 * location error of any network (relative error of order (d/R)², below 1e-5 at 20 km).
 */
export function eastNorthOf(siteLatDeg: number, siteLonDeg: number, latDeg: number, lonDeg: number): { eastM: number; northM: number } {
  let dLon = lonDeg - siteLonDeg
  if (dLon > 180) dLon -= 360
  else if (dLon < -180) dLon += 360
  return {
    eastM: EARTH_RADIUS_M * dLon * RAD * Math.cos(0.5 * (latDeg + siteLatDeg) * RAD),
    northM: EARTH_RADIUS_M * (latDeg - siteLatDeg) * RAD,
  }
}

/** Degrees of latitude and longitude spanned by `metres` at a latitude (for grid cells and boxes). */
export function degreesFor(metres: number, latDeg: number): { dLat: number; dLon: number } {
  const dLat = metres / EARTH_RADIUS_M / RAD
  const cos = Math.max(1e-6, Math.cos(latDeg * RAD))
  return { dLat, dLon: Math.min(360, dLat / cos) }
}
