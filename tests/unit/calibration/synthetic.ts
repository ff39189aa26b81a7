// Synthetic lightning and impulse records with known parameters, for recovery and coverage checks.
import seedrandom from 'seedrandom'
import { EARTH_MEAN_RADIUS_KM } from '../../../shared/calibration/geo'

export type Rng = () => number

export function rng(seed: string | number): Rng {
  return seedrandom(String(seed))
}

/** Standard normal variate by the Box–Muller transform (Box & Muller 1958). */
export function normal(r: Rng): number {
  const u = 1 - r()
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * r())
}

/** Poisson variate: count of unit-rate exponential gaps within `mean` (Knuth, TAOCP vol. 2, 3.4.1). */
export function poisson(r: Rng, mean: number): number {
  let t = 0
  let k = -1
  while (t <= mean) { t += -Math.log(1 - r()); k++ }
  return k
}

const RAD = Math.PI / 180

/** Destination point from a start, a bearing and a great-circle distance (spherical trigonometry, Aviation Formulary, Williams). */
export function destination(latDeg: number, lonDeg: number, bearingRad: number, distanceKm: number): [number, number] {
  const d = distanceKm / EARTH_MEAN_RADIUS_KM
  const lat1 = latDeg * RAD
  const lat2 = Math.asin(Math.sin(lat1) * Math.cos(d) + Math.cos(lat1) * Math.sin(d) * Math.cos(bearingRad))
  const lon2 = lonDeg * RAD + Math.atan2(Math.sin(bearingRad) * Math.sin(d) * Math.cos(lat1), Math.cos(d) - Math.sin(lat1) * Math.sin(lat2))
  return [lat2 / RAD, ((lon2 / RAD + 540) % 360) - 180]
}

/** A point uniform over a disc (small enough that the sphere's curvature does not matter). */
export function uniformInDisc(r: Rng, latDeg: number, lonDeg: number, radiusKm: number): [number, number] {
  return destination(latDeg, lonDeg, 2 * Math.PI * r(), radiusKm * Math.sqrt(r()))
}

/** Log-normal currents (kA) with median e^μ and log standard deviation σ, kept only at or above T. */
export function truncatedLognormalSample(r: Rng, n: number, mu: number, sigma: number, thresholdKa: number): number[] {
  const out: number[] = []
  while (out.length < n) {
    const x = Math.exp(mu + sigma * normal(r))
    if (x >= thresholdKa) out.push(x)
  }
  return out
}
