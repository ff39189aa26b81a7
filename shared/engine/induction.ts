// Induced potential on a tank's internal parts (Rusk, MODEL.md §3).

/** Z0 = 30 Ω in Rusk's formula. */
export const RUSK_Z0_OHM = 30
/** Speed of light in vacuum, m/s (SI definition). */
export const SPEED_OF_LIGHT_M_PER_S = 299_792_458

/** Rusk's velocity factor 1 + (1/√2)·β / sqrt(1 − β²/2), β = v/c. */
export function ruskVelocityFactor(beta: number): number {
  return 1 + Math.SQRT1_2 * beta / Math.sqrt(1 - beta * beta / 2)
}

/** Coupling Kc = Z0·factor(v/c) in Ω, i.e. kV per (kA·m/m); 38.85 Ω at v = 1.2·10⁸ m/s. */
export function ruskCoupling(returnStrokeVelocity: number): number {
  return RUSK_Z0_OHM * ruskVelocityFactor(returnStrokeVelocity / SPEED_OF_LIGHT_M_PER_S)
}

/** The coupling a run uses: a calibrated override when given, otherwise Rusk's value. */
export function couplingCoefficient(p: { returnStrokeVelocity: number; couplingOverride: number | null }): number {
  return p.couplingOverride ?? ruskCoupling(p.returnStrokeVelocity)
}

/**
 * Peak induced potential V = Kc·I·h / y in kV. Rusk assumes y ≫ h over a perfectly conducting
 * ground; closer than the part's height or the tank's radius the formula would diverge, so y is
 * floored at max(h, a) — the engine applies the same floor everywhere.
 */
export function inducedPotentialKv(couplingOhm: number, currentKa: number, partHeightM: number, distanceM: number, tankRadiusM = 0): number {
  const floor = Math.max(partHeightM, tankRadiusM)
  return couplingOhm * currentKa * partHeightM / Math.max(distanceM, floor)
}
