// Ignition and loss given a spark or a direct strike (MODEL.md §4).
import type { TankInput } from './types'
import type { AssumptionSet } from './assumptions'

/** Steel walls carry the current around the vapour space: no induced-sparking term (MODEL.md §4). */
export function hasInducedSparking(tank: TankInput): boolean {
  return tank.material !== 'steel' && tank.components.some((c) => c.count > 0)
}

/**
 * Ignition given a spark inside the tank. Fresh water gives no flammable vapour; chemicals go by
 * flash point: at or below the limit (GHS flammable-liquid boundary, 60 °C by default) — or
 * unknown, to stay on the safe side — like condensate, above it the low value.
 */
export function ignitionGivenSpark(tank: TankInput, a: AssumptionSet): number {
  if (!tank.flammableVapourSpace) return 0
  const base = tank.contents === 'chemical' ? chemicalIgnition(tank.chemicalFlashPointC, a) : a.ignitionGivenSpark[tank.contents]
  return tank.vapourControl ? base * a.vapourControlFactor : base
}

function chemicalIgnition(flashPointC: number | null | undefined, a: AssumptionSet): number {
  if (flashPointC === null || flashPointC === undefined) return a.ignitionGivenSparkChemicalBelowLimit
  return flashPointC <= a.chemicalFlashPointLimitC ? a.ignitionGivenSparkChemicalBelowLimit : a.ignitionGivenSparkChemicalAboveLimit
}

/**
 * Ignition given a direct strike: a non-conducting tank (FRP, polyethylene, 'other') with a
 * flammable vapour space 0.5, steel 0.02, no vapour space or fresh water 0 (assumption-set values).
 */
export function ignitionGivenDirect(tank: TankInput, a: AssumptionSet): number {
  if (!tank.flammableVapourSpace || tank.contents === 'fresh_water') return 0
  const base = tank.material === 'steel' ? a.ignitionGivenDirectSteel : a.ignitionGivenDirectNonConducting
  return tank.vapourControl ? base * a.vapourControlFactor : base
}

/** Value at risk: replacement + contents + clean-up + interruption — the most one tank's fire can cost. */
export function tankSeverity(tank: TankInput): number {
  return tank.replacementValue + tank.contentsValue + tank.cleanupCost + tank.interruptionCost
}
