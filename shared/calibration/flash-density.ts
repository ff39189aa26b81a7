// Ground flash density from counted flashes around a site (MODEL.md §7).
import { garwoodInterval } from '../engine/statistics'
import { CalibrationInputError } from './errors'

export interface FlashDensityInput {
  /** Ground flashes counted within the radius over the record period. */
  flashCount: number
  radiusKm: number
  periodYears: number
  /** Share of ground flashes the network detects, in (0, 1]; stated by the network operator. */
  detectionEfficiency: number
  confidence?: number
}

export interface FlashDensityEstimate {
  flashCount: number
  areaKm2: number
  periodYears: number
  detectionEfficiency: number
  /** Ng in flashes/km²/yr and its exact Poisson interval. */
  ng: number
  lo: number
  hi: number
  confidence: number
}

/**
 * Ng = N / (π r² · T · DE). The count is Poisson; its exact (Garwood 1936) interval is divided by
 * the same exposure. The detection efficiency is taken as known (the network's stated value), so
 * the interval covers the counting scatter only.
 */
export function estimateFlashDensity(input: FlashDensityInput): FlashDensityEstimate {
  const { flashCount, radiusKm, periodYears, detectionEfficiency } = input
  const confidence = input.confidence ?? 0.95
  const issues: string[] = []
  if (!Number.isInteger(flashCount) || flashCount < 0) issues.push('The flash count must be a whole number ≥ 0.')
  if (!(radiusKm > 0)) issues.push('The radius must be above 0 km.')
  if (!(periodYears > 0)) issues.push('The record period must be above 0 years.')
  if (!(detectionEfficiency > 0 && detectionEfficiency <= 1)) issues.push('The detection efficiency must lie in (0, 1], e.g. 0.9 for 90 %.')
  if (issues.length) throw new CalibrationInputError(issues)
  const areaKm2 = Math.PI * radiusKm * radiusKm
  const exposure = areaKm2 * periodYears * detectionEfficiency
  const { lo, hi } = garwoodInterval(flashCount, confidence)
  return { flashCount, areaKm2, periodYears, detectionEfficiency, ng: flashCount / exposure, lo: lo / exposure, hi: hi / exposure, confidence }
}
