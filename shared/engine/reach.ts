// How far from a tank (or the site) a flash can still matter: sets the simulated disc (MODEL.md §1:
// no flash beyond R gives any tank a sparking probability above the cutoff, nor strikes anything).
import type { PreparedSite } from './kernel'
import { canSpark, captureReach, strikeRadius } from './kernel'

/**
 * Horizontal distance from tank t's axis beyond which a flash of current I neither strikes t, nor
 * gives it a sparking probability above the cutoff — whether it attaches to the ground or to a
 * neighbouring object close enough to t to matter.
 */
export function tankRelevantRadius(ps: PreparedSite, t: number, currentKa: number, rs: number): number {
  let radius = captureReach(ps, t, rs)
  if (!canSpark(ps, t, currentKa)) return radius
  const sparkReach = currentKa * ps.tankSparkReachPerKa[t]!
  if (sparkReach > radius) radius = sparkReach
  const row = t * ps.nObjects
  for (let j = 0; j < ps.nObjects; j++) {
    if (j === t) continue
    const dist = ps.pairDistance[row + j]!
    if (dist < sparkReach) {
      const viaObject = dist + captureReach(ps, j, rs)
      if (viaObject > radius) radius = viaObject
    }
  }
  return radius
}

/** Radius about the site's reference point that contains every tank's relevant disc and every capture zone. */
export function siteRelevantRadius(ps: PreparedSite, currentKa: number): number {
  const rs = strikeRadius(ps, Math.log(currentKa))
  let radius = 0
  for (let t = 0; t < ps.nTanks; t++) {
    radius = Math.max(radius, distanceFromCentre(ps, t) + tankRelevantRadius(ps, t, currentKa, rs))
  }
  for (let j = 0; j < ps.nObjects; j++) {
    radius = Math.max(radius, distanceFromCentre(ps, j) + captureReach(ps, j, rs))
  }
  return radius
}

/** The site radius R reported with a run: the relevant radius at the largest simulated current. */
export function siteRadius(ps: PreparedSite): number {
  return siteRelevantRadius(ps, ps.law.maxKa)
}

function distanceFromCentre(ps: PreparedSite, j: number): number {
  const x = ps.objX[j]!
  const y = ps.objY[j]!
  return Math.sqrt(x * x + y * y)
}
