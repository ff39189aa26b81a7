// Sparking of a tank's internal components under an induced potential (MODEL.md §4).
import { normalCdf } from './normal'

/** Φ(ln(V/U50)/σ): log-normal sparking threshold with scatter; σ = 0 is the sharp threshold. */
export function componentSparkingProbability(potentialKv: number, u50Kv: number, sigma: number): number {
  if (potentialKv <= 0) return 0
  if (sigma === 0) return potentialKv >= u50Kv ? 1 : 0
  return normalCdf(Math.log(potentialKv / u50Kv) / sigma)
}

/** n independent items of one class: 1 − (1 − p)^n. */
export function classSparkingProbability(itemProbability: number, count: number): number {
  return 1 - Math.pow(1 - itemProbability, count)
}

/** The tank sparks if any class does: 1 − Π(1 − p_k). */
export function combinedSparkingProbability(classProbabilities: readonly number[]): number {
  let survive = 1
  for (const p of classProbabilities) survive *= 1 - p
  return 1 - survive
}
